import type { QueryClient } from '@tanstack/react-query';
import { createBrowserRouter, redirect, type RouteObject } from 'react-router-dom';
import { LoadingState } from '../components/ui/spinner';
import { paths } from './paths';
import { AppLayout, appLayoutLoader } from './routes/app-layout';
import { BearingsRoute, bearingsLoader } from './routes/bearings';
import { CapturePlannerRoute } from './routes/capture-planner';
import { CaptureReviewRoute, captureReviewLoader } from './routes/capture-review';
import { CaseRoute, caseLoader } from './routes/case';
import { CaseCompareRoute } from './routes/case-compare';
import { CaseNewRoute } from './routes/case-new';
import { CaseReportRoute } from './routes/case-report';
import { CasesRoute } from './routes/cases';
import { DriveLibraryRoute } from './routes/drive-library';
import { EngineRoute, engineLoader } from './routes/engine';
import { InviteAcceptRoute, inviteAcceptLoader } from './routes/invite-accept';
import { NotFoundRoute } from './routes/not-found';
import { OutboxMessageRoute, outboxMessageLoader } from './routes/outbox-message';
import { OutboxIndexRoute, OutboxRoute, outboxLoader } from './routes/outbox';
import { PublicLayout } from './routes/public-layout';
import { RecordRoute } from './routes/record';
import { ResetPasswordCompleteRoute } from './routes/reset-password-complete';
import { ResetPasswordRoute } from './routes/reset-password';
import { RootLayout } from './routes/root';
import { RouteError } from './routes/route-error';
import { SetupRoute, setupLoader } from './routes/setup';
import { ShopSetupRoute, shopSetupLoader } from './routes/shop-setup';
import { SignInRoute, signInLoader } from './routes/sign-in';
import { SignOutRoute, signOutAction } from './routes/sign-out';
import { TeamRoute, teamLoader } from './routes/team';

/**
 * The client's routes (React Router data router). Loaders warm the TanStack Query cache with the
 * same queryOptions the screens read, so a page renders with its data and a failed load lands in
 * the route's error boundary. Public pages sit in one layout, signed-in pages in the app layout,
 * whose loader sends a visitor without a session to sign-in.
 */
export function createRoutes(queryClient: QueryClient): RouteObject[] {
  return [
    {
      element: <RootLayout />,
      errorElement: <RouteError />,
      // Shown while the first page's loaders run (the session check on opening the app).
      hydrateFallbackElement: <LoadingState label="Opening Crankwise…" className="min-h-screen" />,
      children: [
        {
          element: <PublicLayout />,
          children: [
            { path: paths.signIn, element: <SignInRoute />, loader: signInLoader(queryClient) },
            { path: paths.signOut, element: <SignOutRoute />, action: signOutAction(queryClient) },
            { path: paths.setup, element: <SetupRoute />, loader: setupLoader(queryClient) },
            { path: '/invite/:token', element: <InviteAcceptRoute />, loader: inviteAcceptLoader(queryClient) },
            { path: paths.resetPassword, element: <ResetPasswordRoute /> },
            { path: '/reset-password/:token', element: <ResetPasswordCompleteRoute /> },
          ],
        },
        {
          path: paths.home,
          element: <AppLayout />,
          loader: appLayoutLoader(queryClient),
          children: [
            {
              // Errors of a page render inside the layout, so the navigation stays usable.
              errorElement: <RouteError />,
              children: [
                { index: true, loader: () => redirect(paths.cases) },
                { path: paths.cases, element: <CasesRoute /> },
                { path: paths.caseNew, element: <CaseNewRoute /> },
                { path: '/cases/:caseId', element: <CaseRoute />, loader: caseLoader(queryClient) },
                { path: '/cases/:caseId/captures/:captureId/:view?', element: <CaptureReviewRoute />, loader: captureReviewLoader(queryClient) },
                { path: '/cases/:caseId/compare', element: <CaseCompareRoute />, loader: caseLoader(queryClient) },
                { path: '/cases/:caseId/report', element: <CaseReportRoute />, loader: caseLoader(queryClient) },
                { path: '/cases/:caseId/record', element: <RecordRoute />, handle: { fullSafetyNote: true } },
                { path: paths.driveLibrary, element: <DriveLibraryRoute /> },
                { path: `${paths.driveLibrary}/:engineId`, element: <EngineRoute />, loader: engineLoader(queryClient) },
                { path: paths.bearings, element: <BearingsRoute />, loader: bearingsLoader(queryClient) },
                { path: paths.capturePlanner, element: <CapturePlannerRoute />, handle: { fullSafetyNote: true } },
                { path: paths.team, element: <TeamRoute />, loader: teamLoader(queryClient) },
                {
                  path: paths.outbox,
                  element: <OutboxRoute />,
                  loader: outboxLoader(queryClient),
                  children: [
                    { index: true, element: <OutboxIndexRoute /> },
                    { path: ':id', element: <OutboxMessageRoute />, loader: outboxMessageLoader(queryClient), errorElement: <RouteError /> },
                  ],
                },
                { path: paths.shopSetup, element: <ShopSetupRoute />, loader: shopSetupLoader(queryClient) },
                { path: '*', element: <NotFoundRoute /> },
              ],
            },
          ],
        },
      ],
    },
  ];
}

/** The browser router of the running app. */
export function createAppRouter(queryClient: QueryClient) {
  return createBrowserRouter(createRoutes(queryClient));
}
