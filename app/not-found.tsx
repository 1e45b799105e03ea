import Link from 'next/link';
import { SearchBox } from '@/components/search/search-box';

export default function NotFound() {
  return (
    <div className="max-w-prose space-y-6">
      <h1 className="text-4xl">Nothing buried here</h1>
      <p className="text-lg">
        We couldn’t find that page. It may have moved, or the address may have a typo.
      </p>
      <SearchBox variant="hero" id="search-notfound-q" label="Search for a feedstock instead" />
      <p>
        <Link href="/">Back to the home page</Link>
      </p>
    </div>
  );
}
