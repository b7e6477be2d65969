import { NavLink } from 'react-router-dom';
import { cn } from '@/lib/cn';

const links = [
  { to: '/reminders', label: 'Campaigns and calendar', end: true },
  { to: '/reminders/outbox', label: 'Outbox', end: false },
];

/** The reminder screens' own navigation: links (each a page of its own), drawn as tabs. */
export function RemindersNav() {
  return (
    <nav aria-label="Reminders" className="mb-6 flex flex-wrap gap-1 border-b-2 border-loam-200">
      {links.map((link) => (
        <NavLink
          key={link.to}
          to={link.to}
          end={link.end}
          className={({ isActive }) =>
            cn(
              '-mb-0.5 inline-flex min-h-12 items-center border-b-4 px-4 text-lg font-semibold',
              isActive ? 'border-ink-700 text-ink-900' : 'border-transparent text-loam-700 hover:border-loam-300 hover:text-ink-800',
            )
          }
        >
          {link.label}
        </NavLink>
      ))}
    </nav>
  );
}
