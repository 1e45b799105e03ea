'use client';

import Link from 'next/link';
import { usePathname } from 'next/navigation';
import type { MouseEvent, ReactNode } from 'react';

export type NavLinkProps = {
  href: string;
  /** Path prefix that makes this link current; defaults to `href`. */
  section?: string;
  className?: string;
  children: ReactNode;
};

/**
 * A header link that marks the current section with aria-current and closes
 * the mobile menu (<details>) it sits in after a click. Without JavaScript it
 * is an ordinary link.
 */
export function NavLink({ href, section, className, children }: NavLinkProps) {
  const pathname = usePathname();
  const prefix = section ?? href;
  const isCurrent = pathname === prefix || pathname?.startsWith(`${prefix}/`);

  function closeMenu(event: MouseEvent<HTMLAnchorElement>) {
    event.currentTarget.closest('details')?.removeAttribute('open');
  }

  return (
    <Link
      href={href}
      aria-current={isCurrent ? 'page' : undefined}
      onClick={closeMenu}
      className={className}
    >
      {children}
    </Link>
  );
}
