import { Link } from 'react-router-dom';
import { EmptyState } from '../components/empty-state';
import { PageHeader } from '../components/page-header';
import { LoadError, Loading } from '../components/query-state';
import { MaintenanceWindows } from '../features/alerts/components/maintenance-windows';
import { useMyNodes } from '../features/host-portal/api/my-nodes';
import { HostedNode } from '../features/host-portal/components/hosted-node';
import { paths } from '../lib/paths';

/** The host's own page: their sites and nodes in plain words, and a planned power-off announced from a phone. */
export function MyNodesPage() {
  const mine = useMyNodes();
  return (
    <>
      <PageHeader title="My nodes" subtitle="The community network’s equipment at the places you host." />
      {mine.isPending ? (
        <Loading label="Loading your nodes…" />
      ) : mine.isError ? (
        <LoadError error={mine.error} />
      ) : mine.data.data.length === 0 ? (
        <EmptyState title="You do not host a node yet">When the admins record you as the host of a site, its nodes appear here.</EmptyState>
      ) : (
        <div className="space-y-6">
          {mine.data.data.map((site) => (
            <section key={site.id} aria-label={site.name} className="rounded-lg border border-line bg-surface p-4">
              <h2 className="text-lg font-semibold">{site.name}</h2>
              <p className="mb-4 text-sm text-muted">{site.neighbourhoodName}</p>
              {site.nodes.length === 0 ? (
                <p className="text-sm text-muted">No node is installed here yet.</p>
              ) : (
                <div className="space-y-8">
                  {site.nodes.map((node) => (
                    <div key={node.id} className="space-y-4">
                      <HostedNode node={node} />
                      <div className="border-t border-line pt-3">
                        <p className="mb-2 text-sm text-muted">
                          Switching it off for a while (building work, a holiday)? Say when below, and no one is alarmed while it is off.
                        </p>
                        <MaintenanceWindows nodeId={node.id} initial={{ body: node.maintenance, at: mine.dataUpdatedAt }} />
                      </div>
                    </div>
                  ))}
                </div>
              )}
            </section>
          ))}
        </div>
      )}
      <p className="mt-6 text-sm">
        <Link to={paths.preferences.to()} className="text-accent hover:underline">
          Quiet hours and mail
        </Link>
        {' · '}
        <Link to={paths.account.to()} className="text-accent hover:underline">
          Your contact details
        </Link>
      </p>
    </>
  );
}
