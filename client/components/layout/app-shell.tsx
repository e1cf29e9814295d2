import type { ReactNode } from 'react';
import { Link, NavLink } from 'react-router-dom';
import { visibleSections } from '../../../shared/auth/permissions.ts';
import type { Role } from '../../../shared/users/schemas.ts';
import { paths } from '../../config/paths.ts';
import { cn } from '../../lib/cn.ts';

const SECTIONS = {
  log: { label: 'Log', href: paths.log.getHref() },
  plan: { label: 'Plan', href: paths.plan.getHref() },
  week: { label: 'My week', href: paths.myWeek.getHref() },
  squad: { label: 'Squad', href: paths.squad.getHref() },
  tools: { label: 'Tools', href: paths.tools.getHref() },
  admin: { label: 'Admin', href: paths.admin.getHref() },
} as const;

type AppShellProps = {
  role: Role;
  actions: ReactNode;
  children: ReactNode;
  /** Unread notes per section (a small count beside its word), e.g. `{ log: 2, squad: 1 }`. */
  unread?: Partial<Record<'log' | 'squad', number>>;
};

/** Top bar with the sections; below 768 px the same nav sits at the bottom of the screen, within thumb reach. */
export function AppShell({ role, actions, children, unread = {} }: AppShellProps) {
  const sections = visibleSections(role).map((key) => ({ key, ...SECTIONS[key] }));
  return (
    <div className="min-h-dvh">
      <a
        href="#main"
        className="sr-only z-50 rounded bg-teal text-white focus:not-sr-only focus:fixed focus:top-2 focus:left-2 focus:px-3 focus:py-2"
      >
        Skip to content
      </a>
      <header className="sticky top-0 z-20 border-b border-line bg-paper">
        <div className="mx-auto flex h-14 max-w-6xl items-center gap-3 px-4 md:gap-8">
          <Link
            to={paths.log.getHref()}
            className="inline-flex tap-target items-center text-xl font-bold tracking-tight text-ink"
          >
            Pacewright
          </Link>
          <nav
            aria-label="Main"
            className="fixed inset-x-0 bottom-0 z-20 border-t border-line bg-card pb-[env(safe-area-inset-bottom)] md:static md:h-full md:border-0 md:bg-transparent md:pb-0"
          >
            <ul className="grid auto-cols-fr grid-flow-col md:flex md:h-full md:gap-1">
              {sections.map((section) => (
                <li key={section.href} className="md:h-full">
                  <NavLink
                    to={section.href}
                    className={({ isActive }) =>
                      cn(
                        'flex h-14 items-center justify-center gap-1 border-t-3 px-2 text-sm font-semibold md:h-full md:border-t-0 md:border-b-3 md:px-3 md:text-base',
                        isActive ? 'border-teal text-teal' : 'border-transparent text-ink-muted hover:text-ink',
                      )
                    }
                  >
                    {section.label}
                    <UnreadCount count={section.key === 'log' || section.key === 'squad' ? (unread[section.key] ?? 0) : 0} />
                  </NavLink>
                </li>
              ))}
            </ul>
          </nav>
          <div className="ml-auto flex items-center gap-2">{actions}</div>
        </div>
      </header>
      <main id="main" tabIndex={-1} className="mx-auto max-w-6xl px-4 pt-6 pb-24 focus-visible:outline-none md:pb-10">
        {children}
      </main>
    </div>
  );
}

/** The number of notes the other side wrote that the user has not opened, read out with its meaning. */
function UnreadCount({ count }: { count: number }) {
  if (count <= 0) return null;
  return (
    <span
      className="inline-flex min-w-5 items-center justify-center rounded-full bg-tartan px-1.5 text-xs leading-5 font-bold text-white tabular-nums"
      data-unread-count={count}
    >
      {count > 99 ? '99+' : count}
      <span className="sr-only"> unread {count === 1 ? 'note' : 'notes'}</span>
    </span>
  );
}
