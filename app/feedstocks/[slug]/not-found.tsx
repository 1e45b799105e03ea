import Link from 'next/link';
import { SearchBox } from '@/components/search/search-box';

export default function FeedstockNotFound() {
  return (
    <div className="max-w-prose space-y-6">
      <h1 className="text-4xl">No page for that feedstock</h1>
      <p className="text-lg">We have no feedstock at this address. Search for it under another name, or ask for a page.</p>
      <SearchBox variant="hero" id="search-feedstock-notfound-q" label="Search for a feedstock" />
      <p>
        <Link href="/feedstocks/request">Request a new feedstock</Link> · <Link href="/feedstocks">All feedstocks</Link>
      </p>
    </div>
  );
}
