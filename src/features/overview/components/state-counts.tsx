import { NODE_STATES, type NodeState } from '../../../../shared/enums';
import { StateBadge } from '../../../components/state-badge';

/** How many nodes are in each state, every state shown even at zero so the row never shifts. */
export function StateCounts({ counts }: { counts: Record<NodeState, number> }) {
  return (
    <ul data-testid="overview-counts" aria-label="Nodes by state" className="flex flex-wrap gap-2">
      {NODE_STATES.map((state) => (
        <li key={state}>
          <StateBadge state={state} count={counts[state] ?? 0} />
        </li>
      ))}
    </ul>
  );
}
