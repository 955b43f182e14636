import { createBrowserRouter, RouterProvider } from 'react-router-dom';
import { Loading } from '../components/query-state';
import { paths } from '../lib/paths';
import { NotFoundPage } from '../routes/not-found';
import { RouteError } from './route-error';
import { SignedInLayout } from './signed-in-layout';

// Pages load on first visit, so the sign-in page does not carry the whole console.
const router = createBrowserRouter([
  {
    path: paths.signIn.pattern,
    errorElement: <RouteError />,
    hydrateFallbackElement: <Loading />,
    lazy: () => import('../routes/sign-in').then((m) => ({ Component: m.SignInPage })),
  },
  {
    element: <SignedInLayout />,
    errorElement: <RouteError />,
    hydrateFallbackElement: <Loading />,
    children: [
      { index: true, lazy: () => import('../routes/overview').then((m) => ({ Component: m.OverviewPage })) },
      { path: paths.sites.pattern, lazy: () => import('../routes/sites').then((m) => ({ Component: m.SitesPage })) },
      { path: paths.siteNew.pattern, lazy: () => import('../routes/site-new').then((m) => ({ Component: m.SiteNewPage })) },
      { path: paths.siteDetail.pattern, lazy: () => import('../routes/site-detail').then((m) => ({ Component: m.SiteDetailPage })) },
      { path: paths.nodes.pattern, lazy: () => import('../routes/nodes').then((m) => ({ Component: m.NodesPage })) },
      { path: paths.nodeDetail.pattern, lazy: () => import('../routes/node-detail').then((m) => ({ Component: m.NodeDetailPage })) },
      { path: paths.neighbourhoods.pattern, lazy: () => import('../routes/neighbourhoods').then((m) => ({ Component: m.NeighbourhoodsPage })) },
      {
        path: paths.neighbourhoodDetail.pattern,
        lazy: () => import('../routes/neighbourhood-detail').then((m) => ({ Component: m.NeighbourhoodDetailPage })),
      },
      { path: paths.people.pattern, lazy: () => import('../routes/people').then((m) => ({ Component: m.PeoplePage })) },
      { path: '*', element: <NotFoundPage /> },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
