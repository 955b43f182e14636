import { lazy, Suspense } from 'react';
import { Link } from 'react-router-dom';
import { LoadError, Loading } from '../../../components/query-state';
import { StateBadge } from '../../../components/state-badge';
import { capitalise, formatDateTime } from '../../../lib/format';
import { paths } from '../../../lib/paths';
import { useNode } from '../api/nodes';
import { DriftList, LatestFigures } from './node-figures';

// The chart library loads when a node is first chosen, not with the map.
const NodeSparklines = lazy(() => import('./node-sparklines').then((m) => ({ default: m.NodeSparklines })));

interface NodeQuickLookProps {
  nodeId: number;
  openOutageId: number | null;
  onClose: () => void;
}

/** One node in brief, beside the graph: state and why, the latest figures, drift, the last day. */
export function NodeQuickLook({ nodeId, openOutageId, onClose }: NodeQuickLookProps) {
  const node = useNode(nodeId);
  return (
    <section data-testid="node-quick-look" aria-label="Selected node" className="rounded-lg border border-line bg-surface p-3">
      <div className="mb-2 flex items-start justify-between gap-2">
        <h2 className="min-w-0 text-base font-semibold break-words">{node.data?.name ?? 'Node'}</h2>
        <button type="button" onClick={onClose} className="shrink-0 rounded-md p-1 text-muted hover:bg-sunken hover:text-ink" aria-label="Close the node panel">
          <svg width="16" height="16" viewBox="0 0 16 16" aria-hidden="true">
            <path d="M3.5 3.5l9 9M12.5 3.5l-9 9" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
          </svg>
        </button>
      </div>
      {node.isPending ? (
        <Loading label="Loading the node…" />
      ) : node.isError ? (
        <LoadError error={node.error} />
      ) : (
        <div className="space-y-3">
          <div>
            <StateBadge state={node.data.state} />
            <p className="mt-1 text-sm text-muted">
              {node.data.healthReason ? `${capitalise(node.data.healthReason)}. ` : ''}
              {node.data.stateSince ? `In this state since ${formatDateTime(node.data.stateSince)}.` : 'Has not reported yet.'}
            </p>
          </div>
          {openOutageId !== null && (
            <p className="rounded-md border border-danger/40 bg-danger-soft px-2.5 py-1.5 text-sm">
              Open outage.{' '}
              <Link to={paths.outages.to({ nodeId, status: 'open' })} className="font-medium text-accent hover:underline">
                See it on the outages page
              </Link>
            </p>
          )}
          <LatestFigures node={node.data} compact />
          <div>
            <h3 className="mb-1 text-xs font-medium tracking-wide text-muted uppercase">Drift</h3>
            <DriftList node={node.data} />
          </div>
          <Suspense fallback={<Loading label="Loading the charts…" />}>
            <NodeSparklines nodeId={nodeId} />
          </Suspense>
          <Link to={paths.nodeDetail.to(nodeId)} className="inline-block text-sm font-medium text-accent hover:underline">
            Open the node's page
          </Link>
        </div>
      )}
    </section>
  );
}
