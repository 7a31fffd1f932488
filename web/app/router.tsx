import { createBrowserRouter, RouterProvider } from 'react-router';
import { RouteError } from '../components/route-error';
import { RequireRole } from '../features/auth/components/require-role';
import { RootLayout } from './root-layout';

const everyone = ['owner', 'technician', 'admin'] as const;
const staff = ['technician', 'admin'] as const;

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
            path: 'calculators',
            lazy: async () => ({ Component: (await import('./routes/calculators')).CalculatorsRoute }),
          },
          {
            path: 'no-access',
            lazy: async () => ({ Component: (await import('./routes/access-pages')).NoAccessRoute }),
          },
          {
            path: 'sign-in-problem',
            lazy: async () => ({ Component: (await import('./routes/access-pages')).SignInProblemRoute }),
          },
          {
            path: 'invitation-invalid',
            lazy: async () => ({ Component: (await import('./routes/access-pages')).InvitationInvalidRoute }),
          },
          {
            path: 'tanks',
            element: <RequireRole roles={everyone} />,
            children: [
              {
                index: true,
                lazy: async () => ({ Component: (await import('./routes/tanks')).MyTanksRoute }),
              },
              {
                path: ':tankId',
                lazy: async () => ({ Component: (await import('./routes/tank')).TankRoute }),
              },
            ],
          },
          {
            path: 'console',
            element: <RequireRole roles={staff} />,
            children: [
              {
                index: true,
                lazy: async () => ({ Component: (await import('./routes/console')).ConsoleHomeRoute }),
              },
              {
                path: 'tanks/new',
                lazy: async () => ({
                  Component: (await import('./routes/console-tank-new')).ConsoleTankNewRoute,
                }),
              },
              {
                path: 'tanks/:tankId/edit',
                lazy: async () => ({
                  Component: (await import('./routes/console-tank-edit')).ConsoleTankEditRoute,
                }),
              },
              {
                path: 'tanks/:tankId/livestock',
                lazy: async () => ({
                  Component: (await import('./routes/console-tank-livestock')).ConsoleTankLivestockRoute,
                }),
              },
              {
                path: 'tanks/:tankId/equipment',
                lazy: async () => ({
                  Component: (await import('./routes/console-tank-equipment')).ConsoleTankEquipmentRoute,
                }),
              },
              {
                path: 'clients',
                lazy: async () => ({
                  Component: (await import('./routes/console-clients')).ConsoleClientsRoute,
                }),
              },
              {
                path: 'alerts',
                lazy: async () => ({ Component: (await import('./routes/alerts-board')).ConsoleAlertsRoute }),
              },
              {
                path: 'staff',
                element: <RequireRole roles={['admin']} />,
                children: [
                  {
                    index: true,
                    lazy: async () => ({
                      Component: (await import('./routes/console-staff')).ConsoleStaffRoute,
                    }),
                  },
                ],
              },
            ],
          },
          {
            path: 'settings',
            element: <RequireRole roles={everyone} />,
            children: [
              {
                path: 'notifications',
                lazy: async () => ({
                  Component: (await import('./routes/settings-notifications')).NotificationSettingsRoute,
                }),
              },
            ],
          },
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
