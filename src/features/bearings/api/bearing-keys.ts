/** Query keys of the Bearings page (DEVELOPERS.md "Client: TanStack Query"). */
export const bearingKeys = {
  all: ['bearings'] as const,
  lists: () => [...bearingKeys.all, 'list'] as const,
  list: () => [...bearingKeys.lists(), {}] as const,
  details: () => [...bearingKeys.all, 'detail'] as const,
  detail: (id: number) => [...bearingKeys.details(), id] as const,
};
