/** Query keys of the Team screen: the shop's users and its invites. */
export const userKeys = {
  all: ['users'] as const,
  lists: () => [...userKeys.all, 'list'] as const,
  list: () => [...userKeys.lists(), {}] as const,
};

export const inviteKeys = {
  all: ['invites'] as const,
  lists: () => [...inviteKeys.all, 'list'] as const,
  list: () => [...inviteKeys.lists(), {}] as const,
};
