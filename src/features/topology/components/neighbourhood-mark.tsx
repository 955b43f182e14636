import type { Node, NodeProps } from '@xyflow/react';
import { memo } from 'react';
import { NODE_STATES, type NodeState } from '../../../../shared/enums';
import { StateShape } from '../../../components/state-badge';
import { countsKey } from '../utils/neighbourhood-marks';

export interface NeighbourhoodMarkData extends Record<string, unknown> {
  neighbourhoodId: number;
  name: string;
  total: number;
  counts: Record<NodeState, number>;
}

export type NeighbourhoodFlowNode = Node<NeighbourhoodMarkData, 'neighbourhood'>;

export const MARK_WIDTH_PX = 168;
export const MARK_HEIGHT_PX = 62;

// Scaled like the nodes (NodeScale sets the variable); a mark kept at its full screen size would cover its neighbours.
const SCALED = { transform: 'scale(var(--pp-node-scale, 1))' };
// The graph's node box is the focused element; the ring shows on the drawn mark.
const RING = 'group-focus-visible:outline-3 group-focus-visible:outline-offset-2 group-focus-visible:outline-focus';

/** A neighbourhood folded into one mark: its name, its node count and a shape and number per state present. */
export const NeighbourhoodMark = memo(function NeighbourhoodMark({ data }: NodeProps<NeighbourhoodFlowNode>) {
  const present = NODE_STATES.filter((s) => data.counts[s] > 0);
  return (
    <div data-testid={`topology-hood-${data.neighbourhoodId}`} data-counts={countsKey(data.counts)} style={{ width: MARK_WIDTH_PX, height: MARK_HEIGHT_PX }}>
      <div
        aria-hidden="true"
        className={`flex h-full w-full flex-col justify-center rounded-xl border-2 border-line-strong bg-surface px-2 py-1 text-ink shadow-sm ${RING}`}
        style={SCALED}
      >
        <span className="flex items-baseline justify-between gap-2 text-[12px] leading-tight font-semibold">
          <span className="truncate">{data.name}</span>
          <span className="shrink-0 text-[11px] font-normal text-muted tabular-nums">{data.total} nodes</span>
        </span>
        <span className="mt-1 flex flex-wrap items-center gap-x-2 gap-y-0.5 text-[11px] tabular-nums">
          {present.map((state) => (
            <span key={state} className="inline-flex items-center gap-0.5" data-state-count={state}>
              <StateShape state={state} size={11} />
              {data.counts[state]}
            </span>
          ))}
        </span>
      </div>
    </div>
  );
});
