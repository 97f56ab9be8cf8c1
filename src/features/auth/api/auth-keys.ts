/** Query keys of the auth feature: who is signed in, and what an invite link points at. */
export const authKeys = {
  all: ['auth'] as const,
  me: () => [...authKeys.all, 'me'] as const,
  invites: () => [...authKeys.all, 'invite'] as const,
  invite: (token: string) => [...authKeys.invites(), token] as const,
};
