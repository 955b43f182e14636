import { useStore, type Node, type NodeProps } from '@xyflow/react';
import { memo } from 'react';
import type { NodeState } from '../../../../shared/enums';
import { StateShape, stateWord } from '../../../components/state-badge';

export interface SiteNodeData extends Record<string, unknown> {
  nodeId: number;
  name: string;
  siteName: string;
  state: NodeState;
  isUplink: boolean;
  hasOpenOutage: boolean;
  /** On the node of an open outage: how many nodes are cut off (stranded) behind it. */
  blastNodeCount: number;
  /** Found by the search box: drawn with a ring until the next search. */
  highlighted: boolean;
}

export type SiteFlowNode = Node<SiteNodeData, 'site'>;

export const SHAPE_PX = 22;

/** The screen size a node keeps when zoomed out: full size down to zoom 1/2.6, smaller after. */
export function nodeScaleFor(zoom: number): number {
  return zoom >= 1 ? 1 : Math.min(1 / zoom, 2.6);
}

// Set by NodeScale on the canvas as one CSS variable, so zooming does not re-render every node.
const SCALED = { transform: 'scale(var(--pp-node-scale, 1))' };

// Below this zoom the names would overlap: only nodes that need attention keep theirs. Shape and
// colour still say every node's state, and the title its word.
const zoomedOut = (s: { transform: [number, number, number] }) => s.transform[2] < 0.75;
const NEEDS_ATTENTION = new Set<NodeState>(['offline', 'degraded', 'stranded']);

export const SiteNode = memo(function SiteNode({ data, selected }: NodeProps<SiteFlowNode>) {
  const zoomedOutNow = useStore(zoomedOut);
  const word = stateWord(data.state);
  const cutOff = data.blastNodeCount;
  const labelled = !zoomedOutNow || selected || data.highlighted || data.isUplink || cutOff > 0 || NEEDS_ATTENTION.has(data.state);
  return (
    <div
      data-testid={`topology-node-${data.nodeId}`}
      data-state={data.state}
      data-cut-off={cutOff > 0 ? cutOff : undefined}
      title={`${data.name} at ${data.siteName}: ${word}${data.isUplink ? ', uplink' : ''}${data.hasOpenOutage ? ', open outage' : ''}${cutOff > 0 ? `, ${cutOff} nodes cut off behind it` : ''}`}
      style={{ width: SHAPE_PX, height: SHAPE_PX }}
    >
      <div className="relative h-full w-full" style={SCALED}>
        {(selected || data.highlighted) && (
          <span
            aria-hidden="true"
            className={`absolute -inset-2.5 rounded-md border-2 border-dashed border-focus ${data.highlighted ? 'animate-pulse' : ''}`}
          />
        )}
        {data.isUplink && <span aria-hidden="true" className="absolute -inset-1 rounded-full border-2 border-accent" />}
        {/* The root of an outage with nodes stranded behind it: a double vermillion ring, so the cause stands out from what it cut off. */}
        {cutOff > 0 && <span aria-hidden="true" className="absolute -inset-2 rounded-full border-[3px] border-double border-state-offline" />}
        <StateShape state={data.state} size={SHAPE_PX} />
        {/* The node's name for assistive technology is its aria-label, which starts with these words. */}
        {labelled && (
          <span aria-hidden="true" className="pointer-events-none absolute top-full left-1/2 mt-1 -translate-x-1/2 text-center leading-tight whitespace-nowrap">
            <span className="block rounded bg-surface/85 px-1 text-[11px] font-medium text-ink">
              {data.name}
              {/* Real spaces between the words, so the text reads as the node's name does. */}
              {data.isUplink && ' '}
              {data.isUplink && <span className="ml-1 rounded bg-accent px-1 text-[9px] font-semibold tracking-wide text-accent-ink uppercase">uplink</span>}
            </span>{' '}
            <span className="block text-[10px] text-muted">{word}</span>
            {cutOff > 0 && ' '}
            {cutOff > 0 && <span className="block text-[10px] font-semibold text-danger">{cutOff} cut off behind it</span>}
          </span>
        )}
      </div>
    </div>
  );
});
