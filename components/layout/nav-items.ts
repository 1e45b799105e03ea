/** Main navigation, in display order. `section` marks which paths count as "here". */
export const NAV_ITEMS = [
  { href: '/feedstocks', label: 'Feedstocks', section: '/feedstocks' },
  { href: '/trials', label: 'Trials', section: '/trials' },
  { href: '/guides', label: 'Guides', section: '/guides' },
  { href: '/tools/mix', label: 'Tools', section: '/tools' },
  { href: '/about', label: 'About', section: '/about' },
] as const;
