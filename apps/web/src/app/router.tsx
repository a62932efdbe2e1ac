import type { QueryClient } from '@tanstack/react-query';
import { createBrowserRouter, redirect, type LoaderFunctionArgs } from 'react-router';
import { NotFound } from '../components/ui/not-found';
import { meQuery } from '../lib/session';
import { RinkLayout } from './layouts/rink-layout';
import { RootLayout } from './layouts/root-layout';
import { RouteError } from './route-error';

// Route modules are lazy: each screen is its own chunk, loaded when first visited.
export function createAppRouter(client: QueryClient) {
  const requireUser = async ({ request }: LoaderFunctionArgs) => {
    const me = await client.ensureQueryData(meQuery);
    if (!me) {
      const url = new URL(request.url);
      throw redirect(`/sign-in?next=${encodeURIComponent(url.pathname + url.search)}`);
    }
    return null;
  };

  return createBrowserRouter([
    {
      element: <RootLayout />,
      errorElement: <RouteError />,
      children: [
        { index: true, lazy: () => import('../features/landing/routes/landing') },
        { path: 'sign-in', lazy: () => import('../features/auth/routes/sign-in') },
        { path: 'sign-up', lazy: () => import('../features/auth/routes/sign-up') },
        { path: 'check-email', lazy: () => import('../features/auth/routes/check-email') },
        { path: 'verified', lazy: () => import('../features/auth/routes/verified') },
        { path: 'forgot-password', lazy: () => import('../features/auth/routes/forgot-password') },
        { path: 'reset-password', lazy: () => import('../features/auth/routes/reset-password') },
        { path: 'invitations/:invitationId', lazy: () => import('../features/staff/routes/accept-invitation') },
        { path: 'r/:slug', lazy: () => import('../features/storefront/routes/rink-page') },
        { path: 'r/:slug/thanks', lazy: () => import('../features/storefront/routes/thanks') },
        {
          loader: requireUser,
          children: [
            { path: 'rinks', lazy: () => import('../features/rinks/routes/rink-chooser') },
            { path: 'rinks/new', lazy: () => import('../features/rinks/routes/create-rink') },
            { path: 'account', lazy: () => import('../features/account/routes/account') },
            { path: 'portal', lazy: () => import('../features/portal/routes/portal-home') },
            { path: 'portal/:slug', lazy: () => import('../features/portal/routes/portal-rink') },
            { path: 'platform', lazy: () => import('../features/platform/routes/platform-rinks') },
            {
              // The console's rink page hands its rink to the report screens, which belong to the reports feature.
              path: 'platform/rinks/:rinkId',
              lazy: () => import('../features/platform/routes/platform-rink'),
              children: [
                { index: true, lazy: () => import('../features/reports/routes/platform-reports') },
                { path: 'reports', lazy: () => import('../features/reports/routes/platform-reports') },
                { path: 'reports/:report', lazy: () => import('../features/reports/routes/platform-report') },
              ],
            },
            {
              path: 'rinks/:rinkSlug',
              element: <RinkLayout />,
              errorElement: <RouteError />,
              children: [
                { index: true, lazy: () => import('../features/rinks/routes/rink-overview') },
                { path: 'counter', lazy: () => import('../features/desk/routes/counter') },
                { path: 'tickets/:ticketId', lazy: () => import('../features/desk/routes/ticket') },
                {
                  path: 'customers/:customerId',
                  lazy: () => import('../features/desk/routes/customer'),
                  // The credits panel belongs to sales; the customer page leaves it a place (its Outlet).
                  children: [{ index: true, lazy: () => import('../features/sales/routes/customer-credits') }],
                },
                { path: 'stations', lazy: () => import('../features/stations/routes/stations') },
                { path: 'stations/:stationId', lazy: () => import('../features/stations/routes/station') },
                { path: 'services', lazy: () => import('../features/catalog/routes/services') },
                { path: 'products', lazy: () => import('../features/sales/routes/products') },
                { path: 'billing', lazy: () => import('../features/sales/routes/billing') },
                { path: 'leagues', lazy: () => import('../features/leagues/routes/leagues') },
                { path: 'leagues/:leagueId', lazy: () => import('../features/leagues/routes/league') },
                { path: 'reports', lazy: () => import('../features/reports/routes/reports') },
                { path: 'reports/:report', lazy: () => import('../features/reports/routes/report') },
                { path: 'staff', lazy: () => import('../features/staff/routes/staff') },
                { path: 'settings', lazy: () => import('../features/rinks/routes/rink-settings') },
              ],
            },
          ],
        },
        { path: '*', element: <NotFound /> },
      ],
    },
  ]);
}
