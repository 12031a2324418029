import { createBrowserRouter, RouterProvider } from 'react-router-dom';
import { AppLayout } from '@/components/layout/app-layout';
import { RouteError } from './routes/route-error';

/** Every page is its own chunk, so readers never download editor, diff or admin code. */
export const router = createBrowserRouter([
  {
    element: <AppLayout />,
    errorElement: <RouteError />,
    children: [
      { index: true, lazy: () => import('./routes/home').then((m) => ({ Component: m.HomePage })) },
      { path: 'sign-in', lazy: () => import('./routes/auth-pages').then((m) => ({ Component: m.SignInPage })) },
      { path: 'sign-up', lazy: () => import('./routes/auth-pages').then((m) => ({ Component: m.SignUpPage })) },
      { path: 'verify', lazy: () => import('./routes/auth-pages').then((m) => ({ Component: m.VerifyPage })) },
      { path: 'forgot-password', lazy: () => import('./routes/auth-pages').then((m) => ({ Component: m.ForgotPasswordPage })) },
      { path: 'reset-password', lazy: () => import('./routes/auth-pages').then((m) => ({ Component: m.ResetPasswordPage })) },
      { path: 'account', lazy: () => import('./routes/account').then((m) => ({ Component: m.AccountPage })) },
      { path: 'admin/users', lazy: () => import('./routes/admin-users').then((m) => ({ Component: m.AdminUsersPage })) },
      { path: 'search', lazy: () => import('./routes/search').then((m) => ({ Component: m.SearchPage })) },
      { path: 'dev/mail', lazy: () => import('./routes/dev-mail').then((m) => ({ Component: m.DevMailPage })) },
      { path: '*', lazy: () => import('./routes/not-found').then((m) => ({ Component: m.NotFoundPage })) },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
