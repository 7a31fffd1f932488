import { createBrowserRouter, RouterProvider } from 'react-router';
import { RouteError } from '../components/route-error';
import { RootLayout } from './root-layout';

const router = createBrowserRouter([
  {
    path: '/',
    Component: RootLayout,
    ErrorBoundary: RouteError,
    children: [
      {
        ErrorBoundary: RouteError,
        children: [
          { index: true, lazy: async () => ({ Component: (await import('./routes/landing')).LandingRoute }) },
          {
            path: '*',
            lazy: async () => ({ Component: (await import('./routes/not-found')).NotFoundRoute }),
          },
        ],
      },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
