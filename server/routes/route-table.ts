// THE route access table: every /api route, declared once, with who may call it and which path
// parameter names a shop-owned record. The /api router is built from it (build-router.ts) and
// tests/server/routes/route-table.test.ts walks every row for every role and a signed-out visitor.
// To add routes: write a file exporting `xRoutes: RouteRow[]` and concatenate it here.
import { analysisRoutes } from './analyses';
import { authRoutes } from './auth';
import { bearingRoutes } from './bearings';
import { captureRoutes } from './captures';
import { caseRoutes } from './cases';
import { engineRoutes } from './engines';
import { calibrationRoutes } from './calibration';
import { similarCaseRoutes } from './similar-cases';
import { orderTrackRoutes } from './order-tracks';
import { findingRoutes } from './findings';
import { healthRoutes } from './health';
import { inviteRoutes } from './invites';
import { outboxRoutes } from './outbox';
import { reportRoutes } from './reports';
import type { RouteRow } from './route-row';
import { setupRoutes } from './setup';
import { shopRoutes } from './shop';
import { userRoutes } from './users';

/** Every API route (paths relative to /api). */
export const routeTable: readonly RouteRow[] = [
  ...healthRoutes,
  ...setupRoutes,
  ...shopRoutes,
  ...authRoutes,
  ...userRoutes,
  ...inviteRoutes,
  ...outboxRoutes,
  ...engineRoutes,
  ...calibrationRoutes,
  ...similarCaseRoutes,
  ...orderTrackRoutes,
  ...bearingRoutes,
  ...caseRoutes,
  ...captureRoutes,
  ...analysisRoutes,
  ...findingRoutes,
  ...reportRoutes,
];
