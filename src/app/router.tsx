import { createBrowserRouter, Outlet, RouterProvider } from 'react-router-dom';
import { AppLayout } from '@/components/layout/app-layout';
import { PageScroll } from '@/components/layout/page-scroll';
import { guideQueries } from '@/features/guides/api/guides';
import { parameterQueries } from '@/features/parameters/api/parameters';
import { queryClient } from '@/lib/query-client';
import { RouteError } from './routes/route-error';

// Loaders run alongside the lazy page chunks: the guide request starts at once instead of after them
// (and not at all when the server sent the guide with the page).
const guideLoader = ({ params }: { params: { slug?: string } }) => {
  if (params.slug) void queryClient.prefetchQuery(guideQueries.detail(params.slug));
  return null;
};

const parameterLoader = ({ params }: { params: { slug?: string } }) => {
  if (params.slug) void queryClient.prefetchQuery(parameterQueries.detail(params.slug));
  return null;
};

// While the first page's chunk loads the screen stays as it is (blank, or the server-drawn page).
const HydrateFallback = () => null;

/** Above every page, the print sheets included: where a page opens scrolled to (see PageScroll). */
function Root() {
  return (
    <>
      <PageScroll />
      <Outlet />
    </>
  );
}

/** Every page is its own chunk, so readers never download editor, diff or admin code. */
export const router = createBrowserRouter([
  {
    element: <Root />,
    HydrateFallback,
    children: [
      // The printable setup sheet has no site chrome at all.
      {
        path: 'guides/:slug/setup/print',
        errorElement: <RouteError />,
        lazy: () => import('./routes/guide-setup-print').then((m) => ({ Component: m.GuideSetupPrintPage })),
      },
      {
        path: 'motors/:id/print',
        errorElement: <RouteError />,
        lazy: () => import('./routes/motor-print').then((m) => ({ Component: m.MotorPrintPage })),
      },
      {
        element: <AppLayout />,
        errorElement: <RouteError />,
        HydrateFallback,
        children: [
          { index: true, lazy: () => import('./routes/home').then((m) => ({ Component: m.HomePage })) },
          { path: 'sign-in', lazy: () => import('./routes/auth-pages').then((m) => ({ Component: m.SignInPage })) },
          { path: 'sign-up', lazy: () => import('./routes/auth-pages').then((m) => ({ Component: m.SignUpPage })) },
          { path: 'verify', lazy: () => import('./routes/auth-pages').then((m) => ({ Component: m.VerifyPage })) },
          { path: 'forgot-password', lazy: () => import('./routes/auth-pages').then((m) => ({ Component: m.ForgotPasswordPage })) },
          { path: 'reset-password', lazy: () => import('./routes/auth-pages').then((m) => ({ Component: m.ResetPasswordPage })) },
          { path: 'account', lazy: () => import('./routes/account').then((m) => ({ Component: m.AccountPage })) },
          { path: 'admin/users', lazy: () => import('./routes/admin-users').then((m) => ({ Component: m.AdminUsersPage })) },
          { path: 'parameters', lazy: () => import('./routes/parameters').then((m) => ({ Component: m.ParametersPage })) },
          { path: 'parameters/:slug', loader: parameterLoader, lazy: () => import('./routes/parameters').then((m) => ({ Component: m.ParameterPage })) },
          { path: 'calculators', lazy: () => import('./routes/calculators').then((m) => ({ Component: m.CalculatorsPage })) },
          { path: 'calculators/:name', lazy: () => import('./routes/calculators').then((m) => ({ Component: m.CalculatorPage })) },
          { path: 'setups', lazy: () => import('./routes/setups').then((m) => ({ Component: m.SetupsPage })) },
          { path: 'setups/compare', lazy: () => import('./routes/setups-compare').then((m) => ({ Component: m.SetupsComparePage })) },
          { path: 'setups/new', lazy: () => import('./routes/setups-new').then((m) => ({ Component: m.SetupsNewPage })) },
          { path: 'runs', lazy: () => import('./routes/runs').then((m) => ({ Component: m.RunsPage })) },
          { path: 'runs/compare', lazy: () => import('./routes/runs-compare').then((m) => ({ Component: m.RunsComparePage })) },
          { path: 'runs/:id', lazy: () => import('./routes/runs').then((m) => ({ Component: m.RunPage })) },
          { path: 'guides', lazy: () => import('./routes/guides').then((m) => ({ Component: m.GuidesPage })) },
          { path: 'guides/new', lazy: () => import('./routes/editor').then((m) => ({ Component: m.GuideNewPage })) },
          { path: 'guides/:slug', loader: guideLoader, lazy: () => import('./routes/guide').then((m) => ({ Component: m.GuidePage })) },
          { path: 'guides/:slug/v/:n', loader: guideLoader, lazy: () => import('./routes/guide').then((m) => ({ Component: m.GuidePage })) },
          { path: 'guides/:slug/compare', lazy: () => import('./routes/guide-compare').then((m) => ({ Component: m.GuideComparePage })) },
          { path: 'guides/:slug/edit', lazy: () => import('./routes/editor').then((m) => ({ Component: m.GuideEditPage })) },
          { path: 'parameters/:slug/edit', lazy: () => import('./routes/editor').then((m) => ({ Component: m.ParameterEditPage })) },
          { path: 'me/revisions', lazy: () => import('./routes/workbench').then((m) => ({ Component: m.WorkbenchPage })) },
          { path: 'review', lazy: () => import('./routes/review').then((m) => ({ Component: m.ReviewQueuePage })) },
          { path: 'review/:revisionId', lazy: () => import('./routes/review').then((m) => ({ Component: m.ReviewDetailPage })) },
          { path: 'motors', lazy: () => import('./routes/motors').then((m) => ({ Component: m.MotorsPage })) },
          { path: 'motors/:id', lazy: () => import('./routes/motor').then((m) => ({ Component: m.MotorPage })) },
          { path: 'search', lazy: () => import('./routes/search').then((m) => ({ Component: m.SearchPage })) },
          { path: 'unsubscribe', lazy: () => import('./routes/unsubscribe').then((m) => ({ Component: m.UnsubscribePage })) },
          { path: 'changes', lazy: () => import('./routes/changes').then((m) => ({ Component: m.ChangesPage })) },
          { path: 'dev/mail', lazy: () => import('./routes/dev-mail').then((m) => ({ Component: m.DevMailPage })) },
          { path: '*', lazy: () => import('./routes/not-found').then((m) => ({ Component: m.NotFoundPage })) },
        ],
      },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
