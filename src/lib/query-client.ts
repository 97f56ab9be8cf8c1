import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { toast } from '../components/ui/toast';
import { ApiError, isUnauthenticated } from './api-client';

/**
 * Query defaults for the whole client (DEVELOPERS.md "Client: TanStack Query"). Errors surface in one place: a query or
 * mutation that fails shows a toast, and a lost session (401) sends the user to sign-in.
 * Queries that handle their own errors (the "who am I" probe, forms showing field errors)
 * opt out with `meta: { quiet: true }` / `meta: { inlineErrors: true }`.
 */

declare module '@tanstack/react-query' {
  interface Register {
    queryMeta: { quiet?: boolean };
    mutationMeta: { inlineErrors?: boolean };
  }
}

export interface QueryClientHooks {
  /** Called when a request finds the session gone; the app navigates to /sign-in. */
  onUnauthenticated?: () => void;
  /** Retries for queries; tests pass 0. */
  retry?: number;
}

function describe(error: unknown): string {
  if (error instanceof ApiError) return error.message;
  return error instanceof Error ? error.message : 'Something went wrong.';
}

/** A QueryClient with Crankwise's defaults and global error handling. */
export function createQueryClient(hooks: QueryClientHooks = {}): QueryClient {
  const retry = hooks.retry ?? 1;
  const handleUnauthenticated = () => hooks.onUnauthenticated?.();
  const client: QueryClient = new QueryClient({
    queryCache: new QueryCache({
      onError: (error, query) => {
        if (query.meta?.quiet) return;
        if (isUnauthenticated(error)) {
          handleUnauthenticated();
          return;
        }
        toast({ title: 'Could not load data', description: describe(error), variant: 'error' });
      },
    }),
    mutationCache: new MutationCache({
      onError: (error, _variables, _context, mutation) => {
        if (isUnauthenticated(error)) {
          handleUnauthenticated();
          return;
        }
        if (mutation.meta?.inlineErrors) return;
        toast({ title: 'That did not work', description: describe(error), variant: 'error' });
      },
    }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        refetchOnWindowFocus: false,
        // 4xx answers will not change by asking again; only network trouble and 5xx are retried.
        retry: (count, error) => count < retry && !(error instanceof ApiError && error.status >= 400 && error.status < 500),
      },
      mutations: { retry: false },
    },
  });
  return client;
}
