import Link from 'next/link';
import type { ReactNode } from 'react';
import { SearchBox } from '@/components/search/search-box';
import { DemoBanner } from './demo-banner';
import { NAV_ITEMS } from './nav-items';
import { NavLink } from './nav-link';
import { TrialbedMark } from './trialbed-mark';

/** Where the account slot is drawn: inline in the wide header, or in the small-screen menu. */
export type AccountSlotPlace = { linkClassName: string; buttonClassName: string };

export type SiteHeaderProps = {
  /**
   * The account link(s). Defaults to "Sign in"; app/layout.tsx passes the
   * account links (components/layout/account-nav.tsx). A function is called
   * once per place with that place's link and button classes. It is rendered
   * twice (wide header and the small-screen menu), so keep it free of ids.
   */
  account?: ReactNode | ((place: AccountSlotPlace) => ReactNode);
};

const inlineLink =
  'inline-flex min-h-touch items-center rounded-md px-3 font-semibold text-ink no-underline ' +
  'hover:bg-surface-sunken hover:text-ink aria-[current=page]:bg-accent-soft aria-[current=page]:text-accent-strong';

const menuLink =
  'flex min-h-12 items-center rounded-md px-3 text-lg font-semibold text-ink no-underline ' +
  'hover:bg-surface-sunken hover:text-ink aria-[current=page]:bg-accent-soft aria-[current=page]:text-accent-strong';

const inlineButton =
  'inline-flex min-h-touch cursor-pointer items-center rounded-md border border-line-strong px-3 font-semibold text-ink ' +
  'hover:bg-surface-sunken disabled:cursor-wait disabled:opacity-60';

const menuButton =
  'flex min-h-12 w-full cursor-pointer items-center rounded-md px-3 text-left text-lg font-semibold text-ink ' +
  'hover:bg-surface-sunken disabled:cursor-wait disabled:opacity-60';

function SignInLink({ className }: { className: string }) {
  return (
    <NavLink href="/signin" className={className}>
      Sign in
    </NavLink>
  );
}

/**
 * Site header: demo banner, name and mark, main navigation, compact search,
 * account link. Wide screens show everything inline; below 1024 px the
 * navigation and search fold into a <details> menu that needs no JavaScript.
 */
export function SiteHeader({ account }: SiteHeaderProps) {
  const accountAt = (place: AccountSlotPlace) => (typeof account === 'function' ? account(place) : account);
  const inlineAccount = accountAt({ linkClassName: inlineLink, buttonClassName: inlineButton });
  const menuAccount = accountAt({ linkClassName: menuLink, buttonClassName: menuButton });
  return (
    <header className="border-b border-line bg-surface-raised">
      <DemoBanner />
      <div className="relative mx-auto flex min-h-16 max-w-page items-center gap-3 px-4">
        <Link
          href="/"
          className="-ml-1 inline-flex min-h-touch items-center gap-2 rounded-md px-1 font-display text-2xl text-ink no-underline hover:text-ink"
        >
          <TrialbedMark />
          <span>Trialbed</span>
        </Link>

        {/* Wide screens */}
        <nav aria-label="Main" className="hidden lg:block">
          <ul className="m-0 flex list-none items-center gap-1 p-0">
            {NAV_ITEMS.map((item) => (
              <li key={item.href}>
                <NavLink href={item.href} section={item.section} className={inlineLink}>
                  {item.label}
                </NavLink>
              </li>
            ))}
          </ul>
        </nav>
        <div className="ml-auto hidden items-center gap-2 lg:flex">
          <SearchBox variant="compact" id="search-header-q" className="w-56 xl:w-64" />
          {inlineAccount ?? <SignInLink className={inlineLink} />}
        </div>

        {/* Small screens: a disclosure, no JavaScript needed */}
        <details className="group ml-auto lg:hidden">
          <summary className="inline-flex min-h-touch min-w-touch cursor-pointer list-none items-center gap-2 rounded-md border border-line-strong px-3 font-semibold text-ink hover:bg-surface-sunken [&::-webkit-details-marker]:hidden">
            <svg
              width="20"
              height="20"
              viewBox="0 0 20 20"
              fill="none"
              stroke="currentColor"
              strokeWidth="2"
              strokeLinecap="round"
              aria-hidden="true"
              focusable="false"
            >
              <path d="M3 5.5h14M3 10h14M3 14.5h14" className="group-open:hidden" />
              <path d="m5 5 10 10M15 5 5 15" className="hidden group-open:block" />
            </svg>
            <span>Menu</span>
          </summary>
          <div className="absolute inset-x-0 top-full z-40 border-b border-line bg-surface-raised px-4 pb-4 pt-3 shadow-lg">
            <SearchBox variant="compact" id="search-menu-q" />
            <nav aria-label="Main" className="mt-3">
              <ul className="m-0 flex list-none flex-col gap-1 p-0">
                {NAV_ITEMS.map((item) => (
                  <li key={item.href}>
                    <NavLink href={item.href} section={item.section} className={menuLink}>
                      {item.label}
                    </NavLink>
                  </li>
                ))}
                <li className="mt-1 flex flex-col gap-1 border-t border-line pt-2">
                  {menuAccount ?? <SignInLink className={menuLink} />}
                </li>
              </ul>
            </nav>
          </div>
        </details>
      </div>
    </header>
  );
}
