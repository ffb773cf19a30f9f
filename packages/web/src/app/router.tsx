import { createBrowserRouter, type RouteObject } from 'react-router-dom';
import { AppLayout } from './AppLayout';
import { Home } from './Home';
import { NotFound } from './NotFound';
import { RouteError } from './RouteError';

/**
 * Every route in one place. Feature screens are lazy-loaded:
 *   { path: 'x', lazy: () => import('../features/x/routes/X').then((m) => ({ Component: m.X })) }
 */
export const routes: RouteObject[] = [
  {
    path: '/',
    element: <AppLayout />,
    errorElement: <RouteError />,
    children: [
      { index: true, element: <Home /> },
      { path: '*', element: <NotFound /> },
    ],
  },
];

export const createRouter = () => createBrowserRouter(routes);
