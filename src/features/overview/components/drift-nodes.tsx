import { Link } from 'react-router-dom';
import { EmptyState } from '../../../components/empty-state';
import { paths } from '../../../lib/paths';
import type { DriftNode } from '../api/overview';

const show = (value: unknown) => (value === null || value === undefined || value === '' ? '(none)' : String(value));

/** Nodes whose reported settings differ from the inventory: a channel changed on the roof, a firmware update. */
export function DriftNodes({ nodes }: { nodes: DriftNode[] }) {
  if (nodes.length === 0) return <EmptyState title="No drift">Every reporting node runs what the inventory says.</EmptyState>;
  return (
    <ul data-testid="overview-drift" className="divide-y divide-line rounded-lg border border-line bg-surface text-sm">
      {nodes.map((node) => (
        <li key={node.id} className="px-3 py-2">
          <Link to={paths.nodeDetail.to(node.id)} className="font-medium text-accent hover:underline">
            {node.name}
          </Link>
          <ul className="mt-0.5 text-muted">
            {node.drift.map((item) => (
              <li key={item.field}>
                <code>{item.field}</code>: inventory {show(item.expected)}, node reports {show(item.reported)}
              </li>
            ))}
          </ul>
        </li>
      ))}
    </ul>
  );
}
