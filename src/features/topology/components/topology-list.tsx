import { forwardRef, memo, useId } from 'react';
import { NODE_STATES } from '../../../../shared/enums';
import { Button } from '../../../components/button';
import { StateBadge, stateWord } from '../../../components/state-badge';
import type { TopologyNode } from '../api/topology';
import { countsInWords, type NeighbourhoodSummary } from '../utils/neighbourhood-marks';

interface TopologyListProps {
  summaries: NeighbourhoodSummary[];
  nodesOf: (neighbourhoodId: number) => TopologyNode[];
  openHoodId: number | null;
  onToggleHood: (neighbourhoodId: number) => void;
  onShowNode: (node: TopologyNode) => void;
}

/**
 * The map as a table: one row per neighbourhood with its state counts in words, opening into its
 * nodes. Readable by keyboard and screen reader, and it stays light with thousands of nodes
 * because only the open neighbourhood's rows are drawn.
 */
/** One node's row; a live event redraws only the rows whose node changed (unchanged nodes keep their object). */
const NodeRow = memo(function NodeRow({ node, onShowNode }: { node: TopologyNode; onShowNode: (node: TopologyNode) => void }) {
  return (
    <tr data-testid={`topology-list-node-${node.id}`}>
      <td className="py-1 pr-3 pl-5">
        {node.name} <span className="text-muted">at {node.siteName}</span>
      </td>
      <td className="py-1 pr-3">
        <StateBadge state={node.state} />
      </td>
      <td className="py-1 text-right">
        <Button variant="quiet" onClick={() => onShowNode(node)}>
          Details<span className="sr-only"> of {node.name}</span>
        </Button>
      </td>
    </tr>
  );
});

export const TopologyList = memo(
  forwardRef<HTMLHeadingElement, TopologyListProps>(function TopologyList({ summaries, nodesOf, openHoodId, onToggleHood, onShowNode }, headingRef) {
    const headingId = useId();
    return (
      <section aria-labelledby={headingId} data-testid="topology-list" className="mt-4 rounded-lg border border-line bg-surface p-3">
        <h2 id={headingId} ref={headingRef} tabIndex={-1} className="mb-2 text-base font-semibold">
          The map as a list
        </h2>
        <table className="w-full text-left text-sm">
          <thead className="text-muted">
            <tr>
              <th scope="col" className="py-1 pr-3 font-medium">
                Neighbourhood or node
              </th>
              <th scope="col" className="py-1 pr-3 font-medium">
                State
              </th>
              <th scope="col" className="py-1 font-medium">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          {summaries.map((hood) => {
            const open = hood.neighbourhoodId === openHoodId;
            const rowsId = `${headingId}-hood-${hood.neighbourhoodId}`;
            return (
              <tbody key={hood.neighbourhoodId} id={rowsId} data-testid={`topology-list-hood-${hood.neighbourhoodId}`} className="border-t border-line">
                <tr>
                  <th scope="row" className="py-1.5 pr-3 font-semibold">
                    {hood.name} <span className="font-normal text-muted">({hood.total} nodes)</span>
                  </th>
                  <td className="py-1.5 pr-3">
                    <span className="sr-only">{countsInWords(hood.counts, stateWord)}</span>
                    <span aria-hidden="true" className="flex flex-wrap gap-1">
                      {NODE_STATES.filter((s) => hood.counts[s] > 0).map((s) => (
                        <StateBadge key={s} state={s} count={hood.counts[s]} />
                      ))}
                    </span>
                  </td>
                  <td className="py-1.5 text-right">
                    <Button variant="quiet" aria-expanded={open} aria-controls={rowsId} onClick={() => onToggleHood(hood.neighbourhoodId)}>
                      {open ? 'Hide' : 'Show'} the nodes<span className="sr-only"> of {hood.name}</span>
                    </Button>
                  </td>
                </tr>
                {open && nodesOf(hood.neighbourhoodId).map((node) => <NodeRow key={node.id} node={node} onShowNode={onShowNode} />)}
              </tbody>
            );
          })}
        </table>
      </section>
    );
  }),
);
