export const tokenKeys = {
  all: ['api-tokens'] as const,
  lists: () => [...tokenKeys.all, 'list'] as const,
};
