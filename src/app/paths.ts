import type { NavSection } from '../../shared/auth/roles';

/** The five views of Capture review. */
export const CAPTURE_VIEWS = ['orders', 'cycle', 'spectrogram', 'speed', 'listen'] as const;
export type CaptureView = (typeof CAPTURE_VIEWS)[number];

/** Every client URL in one place; links and redirects use these, never hand-typed strings. */
export const paths = {
  home: '/',
  signIn: '/sign-in',
  signOut: '/sign-out',
  setup: '/setup',
  invite: (token: string) => `/invite/${encodeURIComponent(token)}`,
  resetPassword: '/reset-password',
  resetPasswordComplete: (token: string) => `/reset-password/${encodeURIComponent(token)}`,
  cases: '/cases',
  caseNew: '/cases/new',
  case: (id: number | string) => `/cases/${id}`,
  captureReview: (caseId: number | string, captureId: number | string, view: CaptureView = 'orders') => `/cases/${caseId}/captures/${captureId}/${view}`,
  caseCompare: (id: number | string) => `/cases/${id}/compare`,
  caseReport: (id: number | string, copy: 'advisor' | 'customer' = 'advisor') => `/cases/${id}/report${copy === 'customer' ? '?copy=customer' : ''}`,
  caseRecord: (caseId: number | string) => `/cases/${caseId}/record`,
  driveLibrary: '/drive-library',
  bearings: '/bearings',
  capturePlanner: '/capture-planner',
  team: '/team',
  outbox: '/outbox',
  outboxMessage: (id: number | string) => `/outbox/${id}`,
  shopSetup: '/shop-setup',
} as const;

/** Where each navigation section lives. */
export const sectionPaths: Record<NavSection, string> = {
  cases: paths.cases,
  'drive-library': paths.driveLibrary,
  bearings: paths.bearings,
  'capture-planner': paths.capturePlanner,
  team: paths.team,
  outbox: paths.outbox,
  'shop-setup': paths.shopSetup,
};

/** A safe in-app target for `?next=`: only a local path, never another origin. */
export function safeNext(next: string | null | undefined): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith(paths.signIn) || next.startsWith(paths.signOut)) {
    return paths.cases;
  }
  return next;
}
