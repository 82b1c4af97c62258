import { createBrowserRouter, Navigate, RouterProvider, type RouteObject } from 'react-router-dom';
import { paths } from '@/config/paths';
import { AppLayout } from './routes/app/app-layout';
import { RouteError } from './routes/route-error';

const lazyPage = (load: () => Promise<{ default: React.ComponentType }>) => async () => ({ Component: (await load()).default });

/** Every route gets the error boundary (a page's own, so the shell stays around it). */
const withErrors = (routes: RouteObject[]): RouteObject[] =>
  routes.map((r) => ({ ...r, errorElement: r.errorElement ?? <RouteError />, ...(r.children ? { children: withErrors(r.children) } : {}) }) as RouteObject);

export function createRouter() {
  return createBrowserRouter(withErrors([
    { path: paths.signIn, lazy: lazyPage(() => import('./routes/auth/sign-in')) },
    { path: paths.signUp, lazy: lazyPage(() => import('./routes/auth/sign-up')) },
    { path: paths.confirmSignUp, lazy: lazyPage(() => import('./routes/auth/confirm-sign-up')) },
    { path: paths.forgotPassword, lazy: lazyPage(() => import('./routes/auth/forgot-password')) },
    { path: paths.resetPassword, lazy: lazyPage(() => import('./routes/auth/reset-password')) },
    { path: paths.invitation, lazy: lazyPage(() => import('./routes/auth/invitation')) },
    { path: paths.outbox, lazy: lazyPage(() => import('./routes/outbox')) },
    {
      path: paths.home,
      element: <AppLayout />,
      children: [
        { index: true, element: <Navigate to={paths.today} replace /> },
        { path: paths.today, lazy: lazyPage(() => import('./routes/app/today')) },
        { path: paths.cellar, lazy: lazyPage(() => import('./routes/app/cellar')) },
        { path: '/cellar/lots/:lotId', lazy: lazyPage(() => import('./routes/app/lot')) },
        { path: paths.equipment, lazy: lazyPage(() => import('./routes/app/equipment')) },
        { path: paths.cartridges, lazy: lazyPage(() => import('./routes/app/cartridges')) },
        { path: paths.cartridgeImport, lazy: lazyPage(() => import('./routes/app/cartridge-import')) },
        { path: '/cartridges/:cartridgeId', lazy: lazyPage(() => import('./routes/app/cartridge')) },
        { path: paths.plans, lazy: lazyPage(() => import('./routes/app/plans')) },
        { path: '/plans/:planId', lazy: lazyPage(() => import('./routes/app/plan')) },
        { path: paths.runs, lazy: lazyPage(() => import('./routes/app/runs')) },
        { path: '/runs/:runId', lazy: lazyPage(() => import('./routes/app/run')) },
        { path: '/runs/:runId/import', lazy: lazyPage(() => import('./routes/app/run-import')) },
        { path: paths.care, lazy: lazyPage(() => import('./routes/app/care')) },
        { path: paths.records, lazy: lazyPage(() => import('./routes/app/records')) },
        { path: '/records/lots/:lotId', lazy: lazyPage(() => import('./routes/app/record')) },
        { path: paths.team, lazy: lazyPage(() => import('./routes/app/team')) },
        { path: paths.settings, lazy: lazyPage(() => import('./routes/app/settings')) },
        { path: paths.notifications, lazy: lazyPage(() => import('./routes/app/notifications')) },
        { path: paths.recordsChanges, lazy: lazyPage(() => import('./routes/app/records-changes')) },
        { path: paths.waiting, lazy: lazyPage(() => import('./routes/app/waiting')) },
      ],
    },
    { path: '*', lazy: lazyPage(() => import('./routes/not-found')) },
  ]));
}

export function AppRouter() {
  return <RouterProvider router={router} />;
}

const router = createRouter();
