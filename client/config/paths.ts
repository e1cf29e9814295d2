/** Every client URL lives here; components and loaders build links only through these helpers. */
export const paths = {
  home: { path: '/', getHref: () => '/' },
  signIn: {
    path: '/sign-in',
    getHref: (next?: string) => (next ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in'),
  },
  signUp: {
    path: '/sign-up',
    getHref: (next?: string) => (next ? `/sign-up?next=${encodeURIComponent(next)}` : '/sign-up'),
  },
  log: {
    path: '/log',
    getHref: (search?: { page?: number; month?: string }) => {
      const params = new URLSearchParams();
      if (search?.month) params.set('month', search.month);
      if (search?.page && search.page > 1) params.set('page', String(search.page));
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
  squad: { path: '/squad', getHref: () => '/squad' },
  tools: { path: '/tools', getHref: () => '/tools' },
  profile: { path: '/profile', getHref: () => '/profile' },
  admin: { path: '/admin', getHref: () => '/admin' },
} as const;

/** Where to go after signing in: only same-site paths, so `?next=` cannot send people to another site. */
export function resolveNext(next: string | null): string {
  return next?.startsWith('/') && !next.startsWith('//') && !next.startsWith('/\\') ? next : paths.log.getHref();
}
