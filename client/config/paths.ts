import type { RunListOrder, RunListSort } from '../../shared/runs/schemas.ts';

/** Every client URL lives here; components and loaders build links only through these helpers. */
export const paths = {
  home: { path: '/', getHref: () => '/' },
  signIn: {
    path: '/sign-in',
    getHref: (next?: string) => (next ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in'),
  },
  signUp: {
    path: '/sign-up',
    /** `email` prefills the form (an invitation link knows the invited address). */
    getHref: (next?: string, email?: string) => {
      const params = new URLSearchParams();
      if (next) params.set('next', next);
      if (email) params.set('email', email);
      const query = params.toString();
      return query ? `/sign-up?${query}` : '/sign-up';
    },
  },
  signUpConfirm: {
    path: '/sign-up/confirm/:token',
    getHref: (token: string) => `/sign-up/confirm/${encodeURIComponent(token)}`,
  },
  forgotPassword: { path: '/forgot-password', getHref: () => '/forgot-password' },
  resetPassword: { path: '/reset-password/:token', getHref: (token: string) => `/reset-password/${encodeURIComponent(token)}` },
  /** The unsubscribe link at the bottom of every notice e-mail (the server builds the same address). */
  noticesOff: { path: '/notices/off/:token', getHref: (token: string) => `/notices/off/${encodeURIComponent(token)}` },
  invite: { path: '/invite/:token', getHref: (token: string) => `/invite/${encodeURIComponent(token)}` },
  devOutbox: { path: '/dev/outbox', getHref: () => '/dev/outbox' },
  log: {
    path: '/log',
    /**
     * `import` keeps a bulk import's progress bar on the page across reloads; the list's default order (date, desc) is
     * left out. `after` is the runs list's keyset cursor of a page past the first (server/features/runs/README.md,
     * decision 46): `page` is then the page's number as shown, and the runs are those after the cursor.
     */
    getHref: (search?: {
      page?: number;
      after?: string;
      month?: string;
      import?: string;
      sort?: RunListSort;
      order?: RunListOrder;
    }) => {
      const params = new URLSearchParams();
      if (search?.month) params.set('month', search.month);
      if (search?.page && search.page > 1) {
        params.set('page', String(search.page));
        if (search.after) params.set('after', search.after);
      }
      if (search?.import) params.set('import', search.import);
      if (search?.sort && search.sort !== 'date') params.set('sort', search.sort);
      if (search?.order && search.order !== 'desc') params.set('order', search.order);
      const query = params.toString();
      return query ? `/log?${query}` : '/log';
    },
  },
  run: { path: '/runs/:id', getHref: (id: string) => `/runs/${encodeURIComponent(id)}` },
  plan: {
    path: '/plan',
    /** The week view opens on the week of `week` (its Monday); the month view on `month` (`YYYY-MM`). */
    getHref: (search?: { view?: 'week' | 'month'; week?: string; month?: string }) => {
      const params = new URLSearchParams();
      if (search?.view === 'month') params.set('view', 'month');
      if (search?.month) params.set('month', search.month);
      if (search?.week) params.set('week', search.week);
      const query = params.toString();
      return query ? `/plan?${query}` : '/plan';
    },
  },
  squad: {
    path: '/squad',
    /** `squad` picks one of several squads; `week` is any day of the week shown. */
    getHref: (search?: { squad?: string; week?: string }) => {
      const params = new URLSearchParams();
      if (search?.squad) params.set('squad', search.squad);
      if (search?.week) params.set('week', search.week);
      const query = params.toString();
      return query ? `/squad?${query}` : '/squad';
    },
  },
  /** A squad runner's plan, opened by their coach: the same views as `plan`. */
  runnerPlan: {
    path: '/squad/:runnerId/plan',
    getHref: (runnerId: string, search?: { view?: 'week' | 'month'; week?: string; month?: string }) => {
      const params = new URLSearchParams();
      if (search?.view === 'month') params.set('view', 'month');
      if (search?.month) params.set('month', search.month);
      if (search?.week) params.set('week', search.week);
      const query = params.toString();
      return `/squad/${encodeURIComponent(runnerId)}/plan${query ? `?${query}` : ''}`;
    },
  },
  weekReview: {
    path: '/squad/:runnerId/week/:date',
    getHref: (runnerId: string, date: string) => `/squad/${encodeURIComponent(runnerId)}/week/${encodeURIComponent(date)}`,
  },
  /** The signed-in runner's own week; without a date, the current one. */
  myWeek: { path: '/week/:date?', getHref: (date?: string) => (date ? `/week/${encodeURIComponent(date)}` : '/week') },
  tools: { path: '/tools', getHref: () => '/tools' },
  /** Fuel items, and the way to the fuel plans of sessions and the goal race. */
  fuel: { path: '/fuel', getHref: () => '/fuel' },
  planFuel: { path: '/plan/:planId/fuel', getHref: (planId: string) => `/plan/${encodeURIComponent(planId)}/fuel` },
  planFuelPrint: {
    path: '/plan/:planId/fuel/print',
    getHref: (planId: string) => `/plan/${encodeURIComponent(planId)}/fuel/print`,
  },
  goalFuel: { path: '/goal-race/fuel', getHref: () => '/goal-race/fuel' },
  goalFuelPrint: { path: '/goal-race/fuel/print', getHref: () => '/goal-race/fuel/print' },
  profile: { path: '/profile', getHref: () => '/profile' },
  fees: { path: '/fees', getHref: () => '/fees' },
  admin: { path: '/admin', getHref: () => '/admin' },
} as const;

/** Where to go after signing in: only same-site paths, so `?next=` cannot send people to another site. */
export function resolveNext(next: string | null): string {
  return next?.startsWith('/') && !next.startsWith('//') && !next.startsWith('/\\') ? next : paths.log.getHref();
}
