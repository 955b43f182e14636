import { Outlet, ScrollRestoration, useNavigate } from 'react-router-dom';
import type { Role } from '../../shared/enums';
import { AppShell, type NavItem } from '../components/layout/app-shell';
import { useSignOut } from '../features/auth/api/session';
import { RequireSession } from '../features/auth/components/require-session';
import { paths } from '../lib/paths';
import { closeSocket } from '../lib/socket';
import { useLiveUpdates } from './live-updates';

function LiveUpdates({ userId }: { userId: number }) {
  useLiveUpdates(userId);
  return null;
}

function navItemsFor(role: Role): NavItem[] {
  const items: NavItem[] = [
    // A resident's first page is their own node; everyone else starts at the overview.
    ...(role === 'host' ? [{ to: paths.myNodes.to(), label: 'My nodes' }] : []),
    { to: paths.overview.to(), label: 'Overview', end: true },
    { to: paths.topology.to(), label: 'Map' },
    { to: paths.outages.to(), label: 'Outages' },
    { to: paths.nodes.to(), label: 'Nodes' },
    { to: paths.sites.to(), label: 'Sites' },
    { to: paths.neighbourhoods.to(), label: 'Neighbourhoods' },
  ];
  if (role !== 'host') items.push({ to: paths.reports.to(), label: 'Reports' });
  if (role !== 'host') items.push({ to: paths.planning.to(), label: 'Planning' }); // planning answers operators and admins only
  // The people list answers only admins; a link others could only get "not allowed" from would mislead.
  if (role === 'admin') items.push({ to: paths.people.to(), label: 'People' });
  return items;
}

export function SignedInLayout() {
  const navigate = useNavigate();
  const signOut = useSignOut();
  return (
    <RequireSession>
      {(user) => (
        <AppShell
          user={user}
          navItems={navItemsFor(user.role)}
          signingOut={signOut.isPending}
          onSignOut={() => {
            closeSocket();
            signOut.mutate(undefined, { onSettled: () => navigate(paths.signIn.to(), { replace: true }) });
          }}
        >
          <LiveUpdates userId={user.id} />
          <ScrollRestoration />
          <Outlet />
        </AppShell>
      )}
    </RequireSession>
  );
}
