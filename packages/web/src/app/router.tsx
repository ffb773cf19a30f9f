import { createBrowserRouter, type RouteObject } from 'react-router-dom';
import { benchmarkLoader } from '../features/benchmark/api/early';
import { AppLayout } from './AppLayout';
import { Home } from './Home';
import { NotFound } from './NotFound';
import { PageLoading } from './PageLoading';
import { RouteError } from './RouteError';
import { Start } from './Start';

/**
 * Every route in one place. Feature screens are lazy-loaded:
 *   { path: 'x', lazy: () => import('../features/x/routes/X').then((m) => ({ Component: m.X })) }
 */
export const routes: RouteObject[] = [
  {
    path: '/',
    element: <AppLayout />,
    errorElement: <RouteError />,
    // Shown while the first page's lazy code loads (the data router asks for one).
    hydrateFallbackElement: <PageLoading />,
    children: [
      { index: true, element: <Home /> },
      // Where sign-in comes back to: a practice lead with results lands on them.
      { path: 'start', element: <Start /> },
      {
        path: 'sign-in',
        lazy: () =>
          import('../features/sign-in/routes/SignIn').then((m) => ({ Component: m.SignIn })),
      },
      {
        path: 'sign-out',
        lazy: () =>
          import('../features/sign-in/routes/SignOut').then((m) => ({ Component: m.SignOut })),
      },
      {
        path: 'users',
        lazy: () => import('../features/users/routes/Users').then((m) => ({ Component: m.Users })),
      },
      {
        path: 'audit-trail',
        lazy: () =>
          import('../features/audit-trail/routes/AuditTrail').then((m) => ({
            Component: m.AuditTrail,
          })),
      },
      {
        path: 'extracts/upload',
        lazy: () =>
          import('../features/extracts/routes/UploadExtract').then((m) => ({
            Component: m.UploadExtract,
          })),
      },
      {
        path: 'submissions',
        lazy: () =>
          import('../features/extracts/routes/Submissions').then((m) => ({
            Component: m.Submissions,
          })),
      },
      {
        path: 'practices/:practiceId/submissions',
        lazy: () =>
          import('../features/extracts/routes/Submissions').then((m) => ({
            Component: m.Submissions,
          })),
      },
      {
        path: 'practices/:practiceId/submissions/:submissionId',
        lazy: () =>
          import('../features/extracts/routes/Submission').then((m) => ({
            Component: m.Submission,
          })),
      },
      {
        path: 'coverage',
        lazy: () =>
          import('../features/extracts/routes/Coverage').then((m) => ({ Component: m.Coverage })),
      },
      {
        path: 'quarters',
        lazy: () =>
          import('../features/quarters/routes/Quarters').then((m) => ({ Component: m.Quarters })),
      },
      {
        path: 'measure-sets',
        lazy: () =>
          import('../features/measure-sets/routes/MeasureSets').then((m) => ({
            Component: m.MeasureSets,
          })),
      },
      {
        path: 'measure-sets/:measureSetId',
        lazy: () =>
          import('../features/measure-sets/routes/MeasureSet').then((m) => ({
            Component: m.MeasureSet,
          })),
      },
      {
        path: 'reports',
        lazy: () =>
          import('../features/reports/routes/Reports').then((m) => ({ Component: m.Reports })),
      },
      {
        path: 'reports/:reportId',
        lazy: () =>
          import('../features/reports/routes/Report').then((m) => ({ Component: m.Report })),
      },
      {
        path: 'profile',
        lazy: () =>
          import('../features/profile/routes/Profile').then((m) => ({ Component: m.Profile })),
      },
      {
        path: 'deliveries',
        lazy: () =>
          import('../features/deliveries/routes/Deliveries').then((m) => ({
            Component: m.Deliveries,
          })),
      },
      {
        path: 'deliveries/:kind/:sourceId',
        lazy: () =>
          import('../features/deliveries/routes/Delivery').then((m) => ({
            Component: m.Delivery,
          })),
      },
      {
        path: 'mail-recipients',
        lazy: () =>
          import('../features/deliveries/routes/MailRecipients').then((m) => ({
            Component: m.MailRecipients,
          })),
      },
      // ── digests ──
      {
        path: 'digests',
        lazy: () =>
          import('../features/deliveries/routes/Digests').then((m) => ({ Component: m.Digests })),
      },
      // ── results and benchmarks ──
      {
        path: 'results',
        lazy: () =>
          import('../features/results/routes/PracticeResults').then((m) => ({
            Component: m.MyResults,
          })),
      },
      {
        path: 'practices/:practiceId/results',
        lazy: () =>
          import('../features/results/routes/PracticeResults').then((m) => ({
            Component: m.PracticeResults,
          })),
      },
      {
        path: 'benchmark',
        loader: benchmarkLoader,
        lazy: () =>
          import('../features/benchmark/routes/RegionBenchmark').then((m) => ({
            Component: m.RegionBenchmark,
          })),
      },
      // ── outlier review ──
      {
        path: 'outliers',
        lazy: () =>
          import('../features/review-cases/routes/Outliers').then((m) => ({
            Component: m.Outliers,
          })),
      },
      {
        path: 'outliers/:quarterId/practices/:practiceId/measures/:measureKey',
        lazy: () =>
          import('../features/review-cases/routes/DrillDown').then((m) => ({
            Component: m.DrillDown,
          })),
      },
      {
        path: 'review-cases',
        lazy: () =>
          import('../features/review-cases/routes/ReviewCases').then((m) => ({
            Component: m.ReviewCases,
          })),
      },
      {
        path: 'review-cases/:caseId',
        lazy: () =>
          import('../features/review-cases/routes/ReviewCase').then((m) => ({
            Component: m.ReviewCase,
          })),
      },
      { path: '*', element: <NotFound /> },
    ],
  },
];

export const createRouter = () => createBrowserRouter(routes);
