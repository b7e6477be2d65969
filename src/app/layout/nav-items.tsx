import type { ReactNode } from 'react';
import type { Role } from '@shared/schemas/auth';

export interface NavItem {
  to: string;
  label: string;
  /** Match only this exact path (Home), not everything below it. */
  end?: boolean;
  icon: ReactNode;
}

const iconProps = {
  viewBox: '0 0 24 24',
  className: 'size-6 shrink-0',
  fill: 'none',
  stroke: 'currentColor',
  strokeWidth: 1.8,
  strokeLinecap: 'round' as const,
  strokeLinejoin: 'round' as const,
  'aria-hidden': true,
};

const HomeIcon = (
  <svg {...iconProps}>
    <path d="M3.5 11 12 4l8.5 7" />
    <path d="M5.5 9.5V20h13V9.5" />
    <path d="M10 20v-5.5h4V20" />
  </svg>
);

// A field with rows: accounts are farms.
const AccountsIcon = (
  <svg {...iconProps}>
    <rect x="3.5" y="4.5" width="17" height="15" rx="2" />
    <path d="M7.5 8v8M12 8v8M16.5 8v8" strokeDasharray="2 2" />
  </svg>
);

const UsersIcon = (
  <svg {...iconProps}>
    <circle cx="9" cy="8.5" r="3.2" />
    <path d="M3.5 19.5c.6-3.2 2.8-5 5.5-5s4.9 1.8 5.5 5" />
    <circle cx="17" cy="9.5" r="2.4" />
    <path d="M16 14.6c2.3-.3 4 1.2 4.5 4" />
  </svg>
);

// A barn outline: the grower's own operation.
const OperationIcon = (
  <svg {...iconProps}>
    <path d="M4 20V10l4-5h8l4 5v10Z" />
    <path d="M9.5 20v-5h5v5M9 10h6" />
  </svg>
);

const home: NavItem = { to: '/', label: 'Home', end: true, icon: HomeIcon };
const accounts: NavItem = { to: '/accounts', label: 'Accounts', icon: AccountsIcon };
const users: NavItem = { to: '/admin/users', label: 'Users', icon: UsersIcon };

/** What each role is shown. The server still checks every request; this only tidies the menu. */
export const navItemsByRole: Record<Role, NavItem[]> = {
  admin: [home, accounts, users],
  manager: [home, accounts],
  specialist: [home, accounts],
  grower: [{ to: '/', label: 'My operation', end: true, icon: OperationIcon }],
};
