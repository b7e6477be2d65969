import { useEffect, useRef, useState } from 'react';
import { NavLink, Outlet, useLocation, useNavigation } from 'react-router-dom';
import { LogoMark } from '@/components/ui/logo';
import { useCurrentUser } from '@/features/auth/components/current-user';
import { SignOutButton } from '@/features/auth/components/sign-out-button';
import { cn } from '@/lib/cn';
import { roleLabels } from '@/features/auth/api/roles';
import { navItemsByRole } from './nav-items';

/**
 * The signed-in frame: a dark ink sidebar at 1024 px and wider; below that a top bar whose
 * "Menu" button opens the same navigation, so a tablet in portrait keeps the full width for work.
 */
export function AppLayout() {
  const user = useCurrentUser();
  const location = useLocation();
  const navigation = useNavigation();
  const [menuOpen, setMenuOpen] = useState(false);
  const mainRef = useRef<HTMLElement>(null);
  const firstRender = useRef(true);

  // After a navigation: close the narrow-screen menu and start keyboard/screen-reader users at
  // the new page's title rather than at the top of the document.
  useEffect(() => {
    setMenuOpen(false);
    if (firstRender.current) {
      firstRender.current = false;
      return;
    }
    const title = mainRef.current?.querySelector<HTMLElement>('[data-page-title]');
    (title ?? mainRef.current)?.focus({ preventScroll: false });
  }, [location.pathname]);

  const items = navItemsByRole[user.role];
  const loading = navigation.state === 'loading';

  return (
    <div className="min-h-dvh bg-loam-50">
      <a
        href="#main-content"
        className="sr-only z-50 rounded-lg bg-white px-4 py-3 font-semibold text-ink-900 focus:not-sr-only focus:fixed focus:top-2 focus:left-2"
      >
        Skip to main content
      </a>

      {loading && (
        <div className="fixed inset-x-0 top-0 z-40 h-1 overflow-hidden bg-ink-200" role="status">
          <span className="sr-only">Loading page…</span>
          <span className="block h-full w-1/3 animate-pulse bg-seedling-500" />
        </div>
      )}

      <header className="on-dark sticky top-0 z-30 bg-ink-900 text-ink-100 lg:fixed lg:inset-y-0 lg:left-0 lg:flex lg:w-64 lg:flex-col">
        <div className="flex h-16 items-center justify-between gap-3 px-4 lg:h-20 lg:px-5">
          <NavLink to="/" className="inline-flex min-h-11 items-center gap-2.5 rounded-lg" aria-label="Rowpath, home">
            <LogoMark className="size-9" />
            <span className="text-xl font-bold tracking-tight text-white">Rowpath</span>
          </NavLink>
          <div className="flex items-center gap-3 lg:hidden">
            <p className="hidden text-right text-sm leading-tight sm:block">
              <span className="block font-semibold text-white">{user.name}</span>
              <span className="block text-ink-200">{roleLabels[user.role]}</span>
            </p>
            <button
              type="button"
              className="inline-flex min-h-11 items-center gap-2 rounded-lg border border-ink-500 px-3 font-semibold text-white hover:bg-ink-800"
              aria-expanded={menuOpen}
              aria-controls="main-menu"
              onClick={() => setMenuOpen((open) => !open)}
            >
              <svg viewBox="0 0 24 24" className="size-5" aria-hidden="true" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round">
                {menuOpen ? <path d="M6 6l12 12M18 6 6 18" /> : <path d="M4 7h16M4 12h16M4 17h16" />}
              </svg>
              Menu
            </button>
          </div>
        </div>

        <div
          id="main-menu"
          className={cn(
            'border-t border-ink-700 px-3 pb-4 lg:flex lg:flex-1 lg:flex-col lg:justify-between lg:border-t-0 lg:pb-5',
            menuOpen ? 'block' : 'hidden',
          )}
        >
          <nav aria-label="Main" className="pt-3 lg:pt-2">
            <ul className="space-y-1">
              {items.map((item) => (
                <li key={item.to}>
                  <NavLink
                    to={item.to}
                    end={item.end}
                    className={({ isActive }) =>
                      cn(
                        'relative flex min-h-12 items-center gap-3 rounded-lg px-3 text-lg font-semibold transition-colors',
                        isActive
                          ? 'bg-ink-700 text-white before:absolute before:inset-y-2 before:left-0 before:w-1 before:rounded-full before:bg-seedling-300'
                          : 'text-ink-100 hover:bg-ink-800 hover:text-white',
                      )
                    }
                  >
                    {item.icon}
                    {item.label}
                  </NavLink>
                </li>
              ))}
            </ul>
          </nav>

          <div className="mt-4 border-t border-ink-700 pt-4 lg:mt-0">
            <p className="px-1 leading-snug" data-testid="signed-in-user">
              <span className="block font-semibold text-white">{user.name}</span>
              <span className="block text-sm text-ink-200">{roleLabels[user.role]}</span>
              <span className="block truncate text-sm text-ink-300">{user.email}</span>
            </p>
            <SignOutButton className="mt-3 border-ink-500 text-white hover:bg-ink-800" />
          </div>
        </div>
      </header>

      <main id="main-content" ref={mainRef} tabIndex={-1} className="outline-none lg:pl-64">
        <div className="mx-auto max-w-7xl px-4 py-6 sm:px-6 lg:px-10 lg:py-8">
          <Outlet />
        </div>
      </main>
    </div>
  );
}
