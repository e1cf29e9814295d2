export const adminKeys = {
  all: ['admin'] as const,
  users: () => [...adminKeys.all, 'users'] as const,
  health: () => [...adminKeys.all, 'health'] as const,
};
