import { cleanup, configure } from '@testing-library/react';
import { afterAll, afterEach, beforeAll, beforeEach, vi, type MockInstance } from 'vitest';
import { dismissToast } from '../../src/components/ui/toast';
import { resetCsrfToken } from '../../src/lib/api-client';
import { server } from '../src/helpers/msw-server';

// Client tests (jsdom): the network is MSW and any request without a handler fails the test;
// an unexpected console.error fails the test too (React warnings, act() misuse, failed renders).

// The machine running the suite may be busy: give findBy*/waitFor more than the 1 s default.
configure({ asyncUtilTimeout: 5000 });

beforeAll(() => {
  server.listen({ onUnhandledRequest: 'error' });
  // jsdom has no layout or scrolling; React Router's ScrollRestoration calls this on navigation.
  window.scrollTo = () => {};
});

let consoleError: MockInstance<typeof console.error>;
beforeEach(() => {
  consoleError = vi.spyOn(console, 'error');
});

afterEach(() => {
  cleanup();
  server.resetHandlers();
  resetCsrfToken();
  dismissToast();
  const calls = consoleError.mock.calls;
  consoleError.mockRestore();
  if (calls.length > 0) {
    throw new Error(`console.error was called during the test:\n${calls.map((args: unknown[]) => args.map(String).join(' ')).join('\n')}`);
  }
});

afterAll(() => server.close());
