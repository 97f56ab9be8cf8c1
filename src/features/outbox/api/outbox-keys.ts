/** Query keys of the Outbox (the local mail fake's messages). */
export const outboxKeys = {
  all: ['outbox'] as const,
  lists: () => [...outboxKeys.all, 'list'] as const,
  list: () => [...outboxKeys.lists(), {}] as const,
  details: () => [...outboxKeys.all, 'detail'] as const,
  detail: (id: number) => [...outboxKeys.details(), id] as const,
};
