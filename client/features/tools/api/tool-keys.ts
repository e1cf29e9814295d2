import type { EquivalentsQuery, PacesQuery } from '../../../../shared/race/schemas.ts';

export const toolKeys = {
  all: ['tools'] as const,
  equivalents: () => [...toolKeys.all, 'equivalents'] as const,
  equivalent: (query: EquivalentsQuery) => [...toolKeys.equivalents(), query] as const,
  paces: () => [...toolKeys.all, 'paces'] as const,
  pace: (query: PacesQuery) => [...toolKeys.paces(), query] as const,
};
