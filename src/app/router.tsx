import type { ComponentType } from 'react';
import { createBrowserRouter, RouterProvider } from 'react-router-dom';
import { Loading } from '../components/query-state';
import { NotFoundPage } from '../routes/not-found';
import { componentName, pages } from './pages';
import { RootLayout } from './route-announcer';
import { RouteError } from './route-error';

// Pages load on first visit, so the sign-in page does not carry the whole console. The server names the
// opened page's scripts in the HTML (modulepreload), so these imports usually find them already downloaded.
const pageModules = import.meta.glob<Record<string, ComponentType>>('../routes/*.tsx');

function lazyPage(file: string) {
  const load = pageModules[`../routes/${file}.tsx`];
  if (!load) throw new Error(`src/app/pages.ts names a page file that does not exist: src/routes/${file}.tsx`);
  return () => load().then((m) => ({ Component: m[componentName(file)] }));
}

const router = createBrowserRouter([
  {
    element: <RootLayout />,
    hydrateFallbackElement: <Loading />,
    children: [
      ...pages
        .filter((page) => !page.signedIn)
        .map((page) => ({ path: page.pattern, errorElement: <RouteError />, hydrateFallbackElement: <Loading />, lazy: lazyPage(page.file) })),
      {
        // The console's shell (and its live connection) loads only once someone is signed in.
        lazy: () => import('./signed-in-layout').then((m) => ({ Component: m.SignedInLayout })),
        errorElement: <RouteError />,
        hydrateFallbackElement: <Loading />,
        children: [
          ...pages
            .filter((page) => page.signedIn)
            .map((page) => (page.pattern === '/' ? { index: true, lazy: lazyPage(page.file) } : { path: page.pattern, lazy: lazyPage(page.file) })),
          { path: '*', element: <NotFoundPage /> },
        ],
      },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
