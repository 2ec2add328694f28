import type { QueryClient } from '@tanstack/react-query';
import { createBrowserRouter } from 'react-router-dom';
import { RouteError } from './routes/route-error';
import { RootLayout } from './routes/root-layout';

/** Each page is loaded on demand, with a loader that fills the query cache first. */
export function createAppRouter(queryClient: QueryClient) {
  return createBrowserRouter([
    {
      element: <RootLayout />,
      errorElement: <RouteError />,
      children: [
        {
          path: '/sign-in',
          lazy: async () => {
            const page = await import('./routes/sign-in');
            return { Component: page.SignInPage, loader: page.makeLoader(queryClient) };
          },
        },
        {
          path: '/forgot-password',
          lazy: async () => ({
            Component: (await import('./routes/forgot-password')).ForgotPasswordPage,
          }),
        },
        {
          path: '/link/:token',
          lazy: async () => ({ Component: (await import('./routes/link')).LinkPage }),
        },
        {
          path: '/portraits/:token',
          lazy: async () => ({
            Component: (await import('./routes/looks/portraits-link')).PortraitsLinkPage,
          }),
        },
        {
          path: '/password/:token',
          lazy: async () => ({ Component: (await import('./routes/password')).PasswordPage }),
        },
        {
          lazy: async () => {
            const layout = await import('./routes/signed-in-layout');
            return { Component: layout.SignedInLayout, loader: layout.makeLoader(queryClient) };
          },
          errorElement: <RouteError />,
          children: [
            {
              index: true,
              lazy: async () => ({ Component: (await import('./routes/home')).HomePage }),
            },
            {
              path: '/account',
              lazy: async () => {
                const page = await import('./routes/account');
                return { Component: page.AccountPage, loader: page.makeLoader(queryClient) };
              },
            },
            {
              path: '/studio/clients',
              lazy: async () => {
                const page = await import('./routes/studio/clients');
                return { Component: page.ClientsPage, loader: page.makeLoader(queryClient) };
              },
            },
            {
              path: '/studio/team',
              lazy: async () => {
                const page = await import('./routes/studio/team');
                return { Component: page.TeamPage, loader: page.makeLoader(queryClient) };
              },
            },
            {
              path: '/days/:dayId/setup',
              lazy: async () => {
                const page = await import('./routes/setup/setup-cards');
                return { Component: page.SetupCardsPage, loader: page.makeLoader(queryClient) };
              },
            },
            {
              path: '/days/:dayId/setup/print',
              lazy: async () => {
                const page = await import('./routes/setup/setup-print');
                return { Component: page.SetupPrintPage, loader: page.makeLoader(queryClient) };
              },
            },
            {
              path: '/people',
              lazy: async () => ({
                loader: (await import('./routes/roster/my-people')).makeLoader(queryClient),
              }),
            },
            {
              path: '/clients/:clientId/people',
              lazy: async () => {
                const page = await import('./routes/roster/people');
                return { Component: page.PeoplePage, loader: page.makeLoader(queryClient) };
              },
            },
            {
              path: '/clients/:clientId/people/import',
              lazy: async () => {
                const page = await import('./routes/roster/import');
                return { Component: page.RosterImportPage, loader: page.makeLoader(queryClient) };
              },
            },
            {
              path: '/studio/mailbox',
              lazy: async () => {
                const page = await import('./routes/studio/mailbox');
                return { Component: page.MailboxPage, loader: page.makeLoader(queryClient) };
              },
            },
            {
              path: '/days',
              lazy: async () => {
                const page = await import('./routes/days/days');
                return { Component: page.DaysPage, loader: page.makeLoader(queryClient) };
              },
            },
            {
              path: '/days/:dayId',
              lazy: async () => {
                const page = await import('./routes/days/day');
                return { Component: page.DayPage, loader: page.makeLoader(queryClient) };
              },
            },
            {
              path: '/days/:dayId/frames',
              lazy: async () => {
                const page = await import('./routes/frames/day-frames');
                return { Component: page.DayFramesPage, loader: page.makeLoader(queryClient) };
              },
            },
            {
              path: '/days/:dayId/review',
              lazy: async () => {
                const page = await import('./routes/frames/day-review');
                return { Component: page.DayReviewPage, loader: page.makeLoader(queryClient) };
              },
            },
            {
              path: '/days/:dayId/retouch',
              lazy: async () => {
                const page = await import('./routes/frames/day-retouch');
                return { Component: page.DayRetouchPage, loader: page.makeLoader(queryClient) };
              },
            },
            {
              path: '/days/:dayId/set',
              lazy: async () => {
                const page = await import('./routes/looks/day-set');
                return { Component: page.DaySetPage, loader: page.makeLoader(queryClient) };
              },
            },
            {
              path: '/clients/:clientId/look',
              lazy: async () => {
                const page = await import('./routes/looks/client-look');
                return { Component: page.ClientLookPage, loader: page.makeLoader(queryClient) };
              },
            },
            {
              path: '/proofs/:dayId',
              lazy: async () => {
                const page = await import('./routes/proofs/sitter-proofs');
                return { Component: page.SitterProofsPage, loader: page.makeLoader(queryClient) };
              },
            },
            {
              path: '/days/:dayId/summary',
              lazy: async () => {
                const page = await import('./routes/invoices/day-summary');
                return { Component: page.DaySummaryPage, loader: page.makeLoader(queryClient) };
              },
            },
            {
              path: '/clients/:clientId/summary',
              lazy: async () => {
                const page = await import('./routes/invoices/client-summary');
                return { Component: page.ClientSummaryPage, loader: page.makeLoader(queryClient) };
              },
            },
            {
              path: '/invoices/:invoiceId',
              lazy: async () => {
                const page = await import('./routes/invoices/invoice');
                return { Component: page.InvoicePage, loader: page.makeLoader(queryClient) };
              },
            },
            {
              path: '/days/:dayId/sheet',
              lazy: async () => {
                const page = await import('./routes/days/day-sheet');
                return { Component: page.DaySheetPage, loader: page.makeLoader(queryClient) };
              },
            },
          ],
        },
        // The station console has its own full-screen layout for tablets.
        {
          path: '/console',
          lazy: async () => {
            const page = await import('./routes/console/console-picker');
            return { Component: page.ConsolePickerPage, loader: page.makeLoader(queryClient) };
          },
        },
        {
          path: '/console/:dayId/:stationId',
          lazy: async () => {
            const page = await import('./routes/console/station-console');
            return { Component: page.StationConsolePage, loader: page.makeLoader(queryClient) };
          },
        },
        {
          path: '*',
          lazy: async () => ({ Component: (await import('./routes/not-found')).NotFoundPage }),
        },
      ],
    },
  ]);
}
