import { createBrowserRouter, RouterProvider } from 'react-router-dom';
import { Loading } from '../components/query-state';
import { paths } from '../lib/paths';
import { NotFoundPage } from '../routes/not-found';
import { RootLayout } from './route-announcer';
import { RouteError } from './route-error';

// Pages load on first visit, so the sign-in page does not carry the whole console.
const router = createBrowserRouter([
  {
    element: <RootLayout />,
    hydrateFallbackElement: <Loading />,
    children: [
      {
        path: paths.publicStatus.pattern,
        errorElement: <RouteError />,
        hydrateFallbackElement: <Loading />,
        lazy: () => import('../routes/public-status').then((m) => ({ Component: m.PublicStatusPage })),
      },
      {
        // The host's phone page from the outage mail: the signed link is the permission, no sign-in.
        path: paths.hostRecovery.pattern,
        errorElement: <RouteError />,
        hydrateFallbackElement: <Loading />,
        lazy: () => import('../routes/host-recovery').then((m) => ({ Component: m.HostRecoveryPage })),
      },
      {
        path: paths.signIn.pattern,
        errorElement: <RouteError />,
        hydrateFallbackElement: <Loading />,
        lazy: () => import('../routes/sign-in').then((m) => ({ Component: m.SignInPage })),
      },
      ...[
        { path: paths.forgotPassword.pattern, load: () => import('../routes/forgot-password').then((m) => ({ Component: m.ForgotPasswordPage })) },
        { path: paths.resetPassword.pattern, load: () => import('../routes/reset-password').then((m) => ({ Component: m.ResetPasswordPage })) },
        { path: paths.acceptInvitation.pattern, load: () => import('../routes/accept-invitation').then((m) => ({ Component: m.AcceptInvitationPage })) },
      ].map(({ path, load }) => ({ path, errorElement: <RouteError />, hydrateFallbackElement: <Loading />, lazy: load })),
      {
        // The console's shell (and its live connection) loads only once someone is signed in.
        lazy: () => import('./signed-in-layout').then((m) => ({ Component: m.SignedInLayout })),
        errorElement: <RouteError />,
        hydrateFallbackElement: <Loading />,
        children: [
          { index: true, lazy: () => import('../routes/overview').then((m) => ({ Component: m.OverviewPage })) },
          { path: paths.sites.pattern, lazy: () => import('../routes/sites').then((m) => ({ Component: m.SitesPage })) },
          { path: paths.siteNew.pattern, lazy: () => import('../routes/site-new').then((m) => ({ Component: m.SiteNewPage })) },
          { path: paths.siteDetail.pattern, lazy: () => import('../routes/site-detail').then((m) => ({ Component: m.SiteDetailPage })) },
          { path: paths.topology.pattern, lazy: () => import('../routes/topology').then((m) => ({ Component: m.TopologyPage })) },
          { path: paths.outages.pattern, lazy: () => import('../routes/outages').then((m) => ({ Component: m.OutagesPage })) },
          { path: paths.outageDetail.pattern, lazy: () => import('../routes/outage-detail').then((m) => ({ Component: m.OutageDetailPage })) },
          { path: paths.nodes.pattern, lazy: () => import('../routes/nodes').then((m) => ({ Component: m.NodesPage })) },
          { path: paths.nodeDetail.pattern, lazy: () => import('../routes/node-detail').then((m) => ({ Component: m.NodeDetailPage })) },
          { path: paths.neighbourhoods.pattern, lazy: () => import('../routes/neighbourhoods').then((m) => ({ Component: m.NeighbourhoodsPage })) },
          {
            path: paths.neighbourhoodDetail.pattern,
            lazy: () => import('../routes/neighbourhood-detail').then((m) => ({ Component: m.NeighbourhoodDetailPage })),
          },
          { path: paths.planning.pattern, lazy: () => import('../routes/planning').then((m) => ({ Component: m.PlanningPage })) },
          { path: paths.linkBudget.pattern, lazy: () => import('../routes/link-budget').then((m) => ({ Component: m.LinkBudgetPage })) },
          { path: paths.channelPlan.pattern, lazy: () => import('../routes/channel-plan').then((m) => ({ Component: m.ChannelPlanPage })) },
          { path: paths.addressPlan.pattern, lazy: () => import('../routes/address-plan').then((m) => ({ Component: m.AddressPlanPage })) },
          { path: paths.securityReview.pattern, lazy: () => import('../routes/security-review').then((m) => ({ Component: m.SecurityReviewPage })) },
          { path: paths.provisioningSheet.pattern, lazy: () => import('../routes/provisioning-sheet').then((m) => ({ Component: m.ProvisioningSheetPage })) },
          { path: paths.people.pattern, lazy: () => import('../routes/people').then((m) => ({ Component: m.PeoplePage })) },
          { path: paths.imports.pattern, lazy: () => import('../routes/imports').then((m) => ({ Component: m.ImportsPage })) },
          { path: paths.reports.pattern, lazy: () => import('../routes/reports').then((m) => ({ Component: m.ReportsPage })) },
          { path: paths.preferences.pattern, lazy: () => import('../routes/preferences').then((m) => ({ Component: m.PreferencesPage })) },
          { path: paths.myNodes.pattern, lazy: () => import('../routes/my-nodes').then((m) => ({ Component: m.MyNodesPage })) },
          { path: paths.account.pattern, lazy: () => import('../routes/account').then((m) => ({ Component: m.AccountPage })) },
          { path: paths.history.pattern, lazy: () => import('../routes/history').then((m) => ({ Component: m.HistoryPage })) },
          { path: paths.outbox.pattern, lazy: () => import('../routes/outbox').then((m) => ({ Component: m.OutboxPage })) },
          { path: '*', element: <NotFoundPage /> },
        ],
      },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
