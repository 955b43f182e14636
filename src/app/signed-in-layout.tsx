import { Outlet, ScrollRestoration, useNavigate } from 'react-router-dom';
import type { Role } from '../../shared/enums';
import { AppShell, type NavItem } from '../components/layout/app-shell';
import { useSignOut } from '../features/auth/api/session';
import { RequireSession } from '../features/auth/components/require-session';
import { paths } from '../lib/paths';

function navItemsFor(role: Role): NavItem[] {
  const items: NavItem[] = [
    { to: paths.overview.to(), label: 'Overview', end: true },
    { to: paths.nodes.to(), label: 'Nodes' },
    { to: paths.sites.to(), label: 'Sites' },
    { to: paths.neighbourhoods.to(), label: 'Neighbourhoods' },
  ];
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
          onSignOut={() => signOut.mutate(undefined, { onSettled: () => navigate(paths.signIn.to(), { replace: true }) })}
        >
          <ScrollRestoration />
          <Outlet />
        </AppShell>
      )}
    </RequireSession>
  );
}
