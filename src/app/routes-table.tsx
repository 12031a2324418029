import { Outlet, type RouteObject } from 'react-router-dom';
import { routePath } from '@shared/paths';
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
export const routes: RouteObject[] = [
  {
    element: <Root />,
    HydrateFallback,
    children: [
      // The printable setup sheet has no site chrome at all.
      {
        path: routePath('guideSetupPrint'),
        errorElement: <RouteError />,
        lazy: () => import('./routes/guide-setup-print').then((m) => ({ Component: m.GuideSetupPrintPage })),
      },
      {
        path: routePath('motorPrint'),
        errorElement: <RouteError />,
        lazy: () => import('./routes/motor-print').then((m) => ({ Component: m.MotorPrintPage })),
      },
      {
        element: <AppLayout />,
        errorElement: <RouteError />,
        HydrateFallback,
        children: [
          { index: true, lazy: () => import('./routes/home').then((m) => ({ Component: m.HomePage })) },
          { path: routePath('signIn'), lazy: () => import('./routes/auth-pages').then((m) => ({ Component: m.SignInPage })) },
          { path: routePath('signUp'), lazy: () => import('./routes/auth-pages').then((m) => ({ Component: m.SignUpPage })) },
          { path: routePath('verify'), lazy: () => import('./routes/auth-pages').then((m) => ({ Component: m.VerifyPage })) },
          { path: routePath('forgotPassword'), lazy: () => import('./routes/auth-pages').then((m) => ({ Component: m.ForgotPasswordPage })) },
          { path: routePath('resetPassword'), lazy: () => import('./routes/auth-pages').then((m) => ({ Component: m.ResetPasswordPage })) },
          { path: routePath('account'), lazy: () => import('./routes/account').then((m) => ({ Component: m.AccountPage })) },
          { path: routePath('adminUsers'), lazy: () => import('./routes/admin-users').then((m) => ({ Component: m.AdminUsersPage })) },
          { path: routePath('audit'), lazy: () => import('./routes/audit').then((m) => ({ Component: m.AuditPage })) },
          { path: routePath('parameters'), lazy: () => import('./routes/parameters').then((m) => ({ Component: m.ParametersPage })) },
          { path: routePath('parameter'), loader: parameterLoader, lazy: () => import('./routes/parameter').then((m) => ({ Component: m.ParameterPage })) },
          { path: routePath('calculators'), lazy: () => import('./routes/calculators').then((m) => ({ Component: m.CalculatorsPage })) },
          { path: routePath('calculator'), lazy: () => import('./routes/calculators').then((m) => ({ Component: m.CalculatorPage })) },
          { path: routePath('setups'), lazy: () => import('./routes/setups').then((m) => ({ Component: m.SetupsPage })) },
          { path: routePath('setupsCompare'), lazy: () => import('./routes/setups-compare').then((m) => ({ Component: m.SetupsComparePage })) },
          { path: routePath('setupsNew'), lazy: () => import('./routes/setups-new').then((m) => ({ Component: m.SetupsNewPage })) },
          { path: routePath('runs'), lazy: () => import('./routes/runs').then((m) => ({ Component: m.RunsPage })) },
          { path: routePath('runsCompare'), lazy: () => import('./routes/runs-compare').then((m) => ({ Component: m.RunsComparePage })) },
          { path: routePath('run'), lazy: () => import('./routes/runs').then((m) => ({ Component: m.RunPage })) },
          { path: routePath('guides'), lazy: () => import('./routes/guides').then((m) => ({ Component: m.GuidesPage })) },
          { path: routePath('guideNew'), lazy: () => import('./routes/editor').then((m) => ({ Component: m.GuideNewPage })) },
          { path: routePath('guide'), loader: guideLoader, lazy: () => import('./routes/guide').then((m) => ({ Component: m.GuidePage })) },
          { path: routePath('guideVersion'), loader: guideLoader, lazy: () => import('./routes/guide').then((m) => ({ Component: m.GuidePage })) },
          { path: routePath('guideCompare'), lazy: () => import('./routes/guide-compare').then((m) => ({ Component: m.GuideComparePage })) },
          { path: routePath('guideEdit'), lazy: () => import('./routes/editor').then((m) => ({ Component: m.GuideEditPage })) },
          { path: routePath('parameterEdit'), lazy: () => import('./routes/editor').then((m) => ({ Component: m.ParameterEditPage })) },
          { path: routePath('workbench'), lazy: () => import('./routes/workbench').then((m) => ({ Component: m.WorkbenchPage })) },
          { path: routePath('reviewQueue'), lazy: () => import('./routes/review').then((m) => ({ Component: m.ReviewQueuePage })) },
          { path: routePath('review'), lazy: () => import('./routes/review').then((m) => ({ Component: m.ReviewDetailPage })) },
          { path: routePath('motors'), lazy: () => import('./routes/motors').then((m) => ({ Component: m.MotorsPage })) },
          { path: routePath('motor'), lazy: () => import('./routes/motor').then((m) => ({ Component: m.MotorPage })) },
          { path: routePath('search'), lazy: () => import('./routes/search').then((m) => ({ Component: m.SearchPage })) },
          { path: routePath('unsubscribe'), lazy: () => import('./routes/unsubscribe').then((m) => ({ Component: m.UnsubscribePage })) },
          { path: routePath('changes'), lazy: () => import('./routes/changes').then((m) => ({ Component: m.ChangesPage })) },
          { path: routePath('devMail'), lazy: () => import('./routes/dev-mail').then((m) => ({ Component: m.DevMailPage })) },
          { path: '*', lazy: () => import('./routes/not-found').then((m) => ({ Component: m.NotFoundPage })) },
        ],
      },
    ],
  },
];
