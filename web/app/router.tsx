import { createBrowserRouter, RouterProvider } from 'react-router';
import { RouteError } from '../components/route-error';
import { RequirePermission } from '../features/auth/components/require-permission';
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
            element: <RequirePermission permission="tanks:read" />,
            children: [
              {
                index: true,
                lazy: async () => ({ Component: (await import('./routes/tanks')).MyTanksRoute }),
              },
              {
                path: ':tankId',
                lazy: async () => ({ Component: (await import('./routes/tank')).TankRoute }),
              },
              {
                path: ':tankId/messages',
                lazy: async () => ({
                  Component: (await import('./routes/tank-messages')).TankMessagesRoute,
                }),
              },
              {
                path: ':tankId/urgent',
                element: <RequirePermission permission="urgent:request" />,
                children: [
                  {
                    index: true,
                    lazy: async () => ({ Component: (await import('./routes/urgent-new')).UrgentNewRoute }),
                  },
                ],
              },
            ],
          },
          {
            path: 'invoices',
            element: <RequirePermission permission="invoices:read" />,
            children: [
              {
                index: true,
                lazy: async () => ({ Component: (await import('./routes/invoices')).OwnerInvoicesRoute }),
              },
              {
                path: ':invoiceId',
                lazy: async () => ({ Component: (await import('./routes/invoices')).OwnerInvoiceRoute }),
              },
            ],
          },
          {
            path: 'urgent/:requestId',
            element: <RequirePermission permission="urgent:read" />,
            children: [
              {
                index: true,
                lazy: async () => ({
                  Component: (await import('./routes/urgent-request')).UrgentRequestRoute,
                }),
              },
            ],
          },
          {
            path: 'console',
            // The company console: staff only, as the client list in it is.
            element: <RequirePermission permission="clients:read" />,
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
                path: 'schedule',
                element: <RequirePermission permission="visits:write" />,
                children: [
                  {
                    index: true,
                    lazy: async () => ({
                      Component: (await import('./routes/console-schedule')).ConsoleScheduleRoute,
                    }),
                  },
                ],
              },
              {
                path: 'tips',
                element: <RequirePermission permission="care-tips:write" />,
                children: [
                  {
                    index: true,
                    lazy: async () => ({
                      Component: (await import('./routes/console-tips')).ConsoleTipsRoute,
                    }),
                  },
                  {
                    path: 'new',
                    lazy: async () => ({
                      Component: (await import('./routes/console-tips')).ConsoleTipNewRoute,
                    }),
                  },
                  {
                    path: ':tipId',
                    lazy: async () => ({
                      Component: (await import('./routes/console-tips')).ConsoleTipRoute,
                    }),
                  },
                  {
                    path: ':tipId/edit',
                    lazy: async () => ({
                      Component: (await import('./routes/console-tips')).ConsoleTipEditRoute,
                    }),
                  },
                ],
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
                path: 'urgent',
                element: <RequirePermission permission="urgent:manage" />,
                children: [
                  {
                    index: true,
                    lazy: async () => ({
                      Component: (await import('./routes/console-urgent')).ConsoleUrgentRoute,
                    }),
                  },
                  {
                    path: 'settings',
                    element: <RequirePermission permission="urgent:settings" />,
                    children: [
                      {
                        index: true,
                        lazy: async () => ({
                          Component: (await import('./routes/console-urgent-settings'))
                            .ConsoleUrgentSettingsRoute,
                        }),
                      },
                    ],
                  },
                ],
              },
              {
                path: 'invoices',
                element: <RequirePermission permission="invoices:read" />,
                children: [
                  {
                    index: true,
                    lazy: async () => ({
                      Component: (await import('./routes/console-invoices')).ConsoleInvoicesRoute,
                    }),
                  },
                  {
                    path: ':invoiceId',
                    lazy: async () => ({
                      Component: (await import('./routes/console-invoices')).ConsoleInvoiceRoute,
                    }),
                  },
                ],
              },
              {
                path: 'inbox',
                element: <RequirePermission permission="conversations:inbox" />,
                children: [
                  {
                    index: true,
                    lazy: async () => ({
                      Component: (await import('./routes/console-inbox')).ConsoleInboxRoute,
                    }),
                  },
                ],
              },
              {
                path: 'audit',
                element: <RequirePermission permission="audit:read" />,
                children: [
                  {
                    index: true,
                    lazy: async () => ({
                      Component: (await import('./routes/console-audit')).ConsoleAuditRoute,
                    }),
                  },
                ],
              },
              {
                path: 'billing',
                element: <RequirePermission permission="billing:manage" />,
                children: [
                  {
                    index: true,
                    lazy: async () => ({
                      Component: (await import('./routes/console-billing')).ConsoleBillingRoute,
                    }),
                  },
                ],
              },
              {
                path: 'staff',
                element: <RequirePermission permission="staff:read" />,
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
            path: 'visits/:visitId',
            // Writing a report is staff work; owners read published reports on the tank page.
            element: <RequirePermission permission="visits:write" />,
            children: [
              {
                index: true,
                lazy: async () => ({ Component: (await import('./routes/visit-report')).VisitReportRoute }),
              },
            ],
          },
          {
            path: 'settings',
            element: <RequirePermission permission="notifications:own" />,
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
