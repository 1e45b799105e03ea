'use client';

import { usePathname } from 'next/navigation';
import { useEffect } from 'react';
import useSWR from 'swr';
import { SignOutButton } from '@/components/account/sign-out-button';
import { NavLink } from './nav-link';

/** What the header needs to know about the visitor (from GET /api/account). */
type AccountResponse = { account: { email: string | null; role: string } | null };

export const ACCOUNT_KEY = '/api/account';

const fetchAccount = async (url: string): Promise<AccountResponse> => {
  const res = await fetch(url, { credentials: 'same-origin', cache: 'no-store' });
  if (!res.ok) throw new Error(`account ${res.status}`);
  return res.json();
};

export type AccountNavProps = {
  /** Classes of the header's links in the place it is rendered (wide header or menu). */
  linkClassName: string;
  buttonClassName: string;
};

/**
 * The header's account links: "Sign in" for visitors; "Your account" and
 * "Sign out" when signed in. It asks /api/account from the browser, so the
 * pages around it stay cacheable, and asks again after every navigation
 * (signing in or out ends in one). While it loads it shows "Your account",
 * which works for both: /account sends visitors on to /signin.
 */
export function AccountNav({ linkClassName, buttonClassName }: AccountNavProps) {
  const pathname = usePathname();
  const { data, mutate } = useSWR(ACCOUNT_KEY, fetchAccount, { revalidateOnFocus: true, shouldRetryOnError: false });
  useEffect(() => {
    void mutate();
  }, [pathname, mutate]);

  if (data && !data.account) {
    return (
      <NavLink href="/signin" className={linkClassName}>
        Sign in
      </NavLink>
    );
  }
  return (
    <>
      <NavLink href="/account" className={linkClassName}>
        <span>Your account</span>
        {data?.account ? <span className="sr-only"> (signed in as {data.account.email})</span> : null}
      </NavLink>
      {data?.account ? <SignOutButton className={buttonClassName} /> : null}
    </>
  );
}
