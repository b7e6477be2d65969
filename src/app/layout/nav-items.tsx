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

// A gauge: the Sizing calculator.
const SizingIcon = (
  <svg {...iconProps}>
    <path d="M4 16a8 8 0 0 1 16 0" />
    <path d="M12 16l4-5" />
    <path d="M4 19.5h16" />
  </svg>
);

// A toolbar with row units hanging from it: the planters.
const PlantersIcon = (
  <svg {...iconProps}>
    <path d="M3 7.5h18" />
    <path d="M6 7.5v5M10 7.5v5M14 7.5v5M18 7.5v5" />
    <circle cx="6" cy="15" r="2" />
    <circle cx="10" cy="15" r="2" />
    <circle cx="14" cy="15" r="2" />
    <circle cx="18" cy="15" r="2" />
    <path d="M12 7.5V4" />
  </svg>
);

// A parts bin with labelled drawers: the component catalog.
const CatalogIcon = (
  <svg {...iconProps}>
    <rect x="4" y="4" width="16" height="16" rx="2" />
    <path d="M4 10h16M4 15h16M10 7h4M10 12.5h4M10 17.5h4" />
  </svg>
);

// Seasons as steps with a path across them: the grower's upgrade roadmap.
const RoadmapIcon = (
  <svg {...iconProps}>
    <path d="M4 19h4v-4h4v-4h4V7h4" />
    <circle cx="4" cy="19" r="1.3" />
    <circle cx="20" cy="7" r="1.3" />
  </svg>
);

// Two parts joined by a link: the rules between catalog parts.
const RulesIcon = (
  <svg {...iconProps}>
    <rect x="3.5" y="4" width="7" height="6" rx="1.5" />
    <rect x="13.5" y="14" width="7" height="6" rx="1.5" />
    <path d="M7 10v3.5a2 2 0 0 0 2 2h4.5" />
  </svg>
);

// A folded map with a pin: the territory map.
const MapIcon = (
  <svg {...iconProps}>
    <path d="M3.5 6.5 9 4.5l6 2 5.5-2v13L15 19.5l-6-2-5.5 2Z" />
    <path d="M9 4.5v13M15 6.5v5" />
    <circle cx="17.5" cy="13.5" r="2" />
  </svg>
);

// A path through stops across the days: the week plan.
const WeekPlanIcon = (
  <svg {...iconProps}>
    <circle cx="5" cy="6" r="1.8" />
    <circle cx="12" cy="17" r="1.8" />
    <circle cx="19" cy="7" r="1.8" />
    <path d="M6.3 7.4 10.8 15.4M13.3 15.6 17.9 8.6" strokeDasharray="2.5 2" />
  </svg>
);

// A calendar page: visits and installs by day.
const CalendarIcon = (
  <svg {...iconProps}>
    <rect x="3.5" y="5" width="17" height="15" rx="2" />
    <path d="M3.5 9.5h17M8 3v4M16 3v4" />
    <path d="M7.5 13h3v3h-3Z" />
  </svg>
);

// An envelope with a small clock: reminders that go out on their day.
const RemindersIcon = (
  <svg {...iconProps}>
    <rect x="3" y="5.5" width="14" height="11" rx="1.5" />
    <path d="m3.5 6.5 6.5 5 6.5-5" />
    <circle cx="17.5" cy="16.5" r="3.8" fill="currentColor" fillOpacity="0.12" />
    <path d="M17.5 14.8v1.9l1.3.9" />
  </svg>
);

// An open tray with a letter in it: the mail the local server received.
const SentMailIcon = (
  <svg {...iconProps}>
    <path d="M3.5 13.5 6 5.5h12l2.5 8V19h-17Z" />
    <path d="M3.5 13.5h5l1 2h5l1-2h5" />
    <path d="M9 9.5h6" />
  </svg>
);

// Bars rising across the seasons with a dashed quota line: the revenue forecast.
const ForecastIcon = (
  <svg {...iconProps}>
    <path d="M4 20h16" />
    <path d="M6.5 20v-5M11 20v-8M15.5 20v-6M20 20V9" strokeWidth="2.6" />
    <path d="M4 7.5h16" strokeDasharray="2 2" />
  </svg>
);

const home: NavItem = { to: '/', label: 'Home', end: true, icon: HomeIcon };
const accounts: NavItem = { to: '/accounts', label: 'Accounts', icon: AccountsIcon };
const sizing: NavItem = { to: '/sizing', label: 'Sizing', icon: SizingIcon };
const users: NavItem = { to: '/admin/users', label: 'Users', icon: UsersIcon };
const planters: NavItem = { to: '/planters', label: 'Planters', icon: PlantersIcon };
const catalog: NavItem = { to: '/catalog', label: 'Catalog', icon: CatalogIcon };
const partRules: NavItem = { to: '/catalog-rules', label: 'Part rules', icon: RulesIcon };
const territoryMap: NavItem = { to: '/map', label: 'Map', icon: MapIcon };
const weekPlan: NavItem = { to: '/week-plan', label: 'Week plan', icon: WeekPlanIcon };
const calendar: NavItem = { to: '/calendar', label: 'Calendar', icon: CalendarIcon };
const growerVisits: NavItem = { to: '/visits', label: 'Visits', icon: CalendarIcon };
const growerRoadmap: NavItem = { to: '/roadmap', label: 'Roadmap', icon: RoadmapIcon };
const forecast: NavItem = { to: '/forecast', label: 'Forecast', icon: ForecastIcon };
const reminders: NavItem = { to: '/reminders', label: 'Reminders', icon: RemindersIcon };
const sentMail: NavItem = { to: '/sent-mail', label: 'Sent mail', icon: SentMailIcon };
const growerReminders: NavItem = { to: '/reminder-preferences', label: 'Reminders', icon: RemindersIcon };

/** What each role is shown. The server still checks every request; this only tidies the menu. */
export const navItemsByRole: Record<Role, NavItem[]> = {
  admin: [home, accounts, territoryMap, weekPlan, calendar, planters, sizing, catalog, partRules, reminders, forecast, sentMail, users],
  manager: [home, accounts, territoryMap, weekPlan, calendar, planters, sizing, catalog, partRules, reminders, forecast],
  specialist: [home, accounts, territoryMap, weekPlan, calendar, planters, sizing, catalog, reminders, forecast],
  grower: [{ to: '/', label: 'My operation', end: true, icon: OperationIcon }, growerRoadmap, growerVisits, growerReminders],
};
