export const invitationKeys = {
  all: ['invitations'] as const,
  details: () => [...invitationKeys.all, 'detail'] as const,
  detail: (token: string) => [...invitationKeys.details(), token] as const,
};
