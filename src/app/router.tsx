import { createBrowserRouter, Navigate } from 'react-router';
import { AppShell } from './layout/app-shell';
import { RouteError } from './layout/route-error';
import { paths } from './paths';

// Route modules are loaded lazily; each exports `Component`.
export const router = createBrowserRouter([
  { path: paths.signIn, lazy: () => import('./routes/sign-in'), errorElement: <RouteError /> },
  { path: paths.resetRequest, lazy: () => import('./routes/reset-request'), errorElement: <RouteError /> },
  { path: paths.resetConfirm(), lazy: () => import('./routes/reset-confirm'), errorElement: <RouteError /> },
  { path: paths.invite(), lazy: () => import('./routes/invite'), errorElement: <RouteError /> },
  { path: paths.share(), lazy: () => import('./routes/share'), errorElement: <RouteError /> },
  {
    element: <AppShell />,
    errorElement: <RouteError />,
    children: [
      { index: true, element: <Navigate to={paths.planner} replace /> },
      { path: paths.planner, lazy: () => import('./routes/planner') },
      { path: paths.plan(), lazy: () => import('./routes/plan') },
      { path: paths.planPrint(), lazy: () => import('./routes/plan-print') },
      { path: paths.sessions, lazy: () => import('./routes/sessions') },
      { path: paths.session(), lazy: () => import('./routes/session') },
      { path: paths.stack(), lazy: () => import('./routes/stack') },
      { path: paths.kit, lazy: () => import('./routes/kit') },
      { path: paths.studio, lazy: () => import('./routes/studio') },
      { path: paths.handoffs, lazy: () => import('./routes/handoffs') },
      { path: '*', lazy: () => import('./routes/not-found') },
    ],
  },
]);
