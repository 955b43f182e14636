import type { NodeState } from '../../../../shared/enums';
import type { DiscoveredLink, TopologyLink, TopologyNode } from '../api/topology';
import { stateWord } from '../../../components/state-badge';
import { SHAPE_PX, type SiteFlowNode } from '../components/site-node';
import type { XY } from './layout';
import { linkWidthPx, marginBand, type MarginBand } from './link-look';

export interface GraphFilters {
  neighbourhoodId?: number;
  state?: NodeState;
}

export function isShown(node: TopologyNode, filters: GraphFilters): boolean {
  return (
    (filters.neighbourhoodId === undefined || node.neighbourhoodId === filters.neighbourhoodId) && (filters.state === undefined || node.state === filters.state)
  );
}

interface Cached {
  key: string;
  flow: SiteFlowNode;
}

/**
 * Graph nodes for the shown topology nodes. A node whose record, position and marks did not
 * change keeps its object, so one live event redraws one node, not two thousand.
 */
export function buildFlowNodes(
  nodes: TopologyNode[],
  positions: Map<number, XY>,
  marks: { selectedId: number | null; highlightedId: number | null },
  cache: WeakMap<TopologyNode, Cached>,
): SiteFlowNode[] {
  const out: SiteFlowNode[] = [];
  for (const node of nodes) {
    const position = positions.get(node.id);
    if (!position) continue;
    const selected = node.id === marks.selectedId;
    const highlighted = node.id === marks.highlightedId;
    const key = `${position.x},${position.y},${selected},${highlighted}`;
    const cached = cache.get(node);
    if (cached && cached.key === key) {
      out.push(cached.flow);
      continue;
    }
    const blastNodeCount = node.openOutageId !== null ? (node.blastNodeCount ?? 0) : 0;
    const flow: SiteFlowNode = {
      id: String(node.id),
      type: 'site',
      position,
      // Known sizes let the graph skip off-screen nodes before it has measured them.
      width: SHAPE_PX,
      height: SHAPE_PX,
      selected,
      draggable: false,
      connectable: false,
      data: {
        nodeId: node.id,
        name: node.name,
        siteName: node.siteName,
        state: node.state,
        isUplink: node.isUplink,
        hasOpenOutage: node.openOutageId !== null,
        blastNodeCount,
        highlighted,
      },
      // A button to assistive technology: Enter or Space shows the node's details beside the graph.
      // Its name starts with the words drawn under the node, in their order, so speech input finds it.
      ariaRole: 'button',
      ariaLabel: `${node.name}${node.isUplink ? ' uplink' : ''} ${stateWord(node.state)}${blastNodeCount > 0 ? ` ${blastNodeCount} cut off behind it` : ''}, at ${node.siteName}`,
    };
    cache.set(node, { key, flow });
    out.push(flow);
  }
  return out;
}

export interface LinkLine {
  id: number;
  x1: number;
  y1: number;
  x2: number;
  y2: number;
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
  band: MarginBand;
  widthPx: number;
  planned: boolean;
  /** Heard on the air but not in the inventory: drawn dotted in ink, never in a margin colour. */
  discovered?: boolean;
  testId?: string;
}

/** Straight lines, centre to centre, for links whose both ends are shown. */
export function buildLinkLines(links: TopologyLink[], shownIds: Set<number>, positions: Map<number, XY>): LinkLine[] {
  const out: LinkLine[] = [];
  for (const link of links) {
    if (!shownIds.has(link.nodeAId) || !shownIds.has(link.nodeBId)) continue;
    const a = positions.get(link.nodeAId);
    const b = positions.get(link.nodeBId);
    if (!a || !b) continue;
    out.push({
      id: link.id,
      x1: a.x,
      y1: a.y,
      x2: b.x,
      y2: b.y,
      minX: Math.min(a.x, b.x),
      minY: Math.min(a.y, b.y),
      maxX: Math.max(a.x, b.x),
      maxY: Math.max(a.y, b.y),
      band: marginBand(link.fadeMarginDb),
      widthPx: linkWidthPx(link.expectedRateMbps),
      planned: link.status === 'planned',
    });
  }
  return out;
}

/** Dotted lines for pairs the air shows talking that the inventory lacks (synthetic negative ids). */
export function buildDiscoveredLines(found: DiscoveredLink[], shownIds: Set<number>, positions: Map<number, XY>): LinkLine[] {
  const out: LinkLine[] = [];
  found.forEach((d, i) => {
    const a = positions.get(d.nodeAId);
    const b = positions.get(d.nodeBId);
    if (!a || !b || !shownIds.has(d.nodeAId) || !shownIds.has(d.nodeBId)) return;
    out.push({
      id: -(i + 1),
      x1: a.x,
      y1: a.y,
      x2: b.x,
      y2: b.y,
      minX: Math.min(a.x, b.x),
      minY: Math.min(a.y, b.y),
      maxX: Math.max(a.x, b.x),
      maxY: Math.max(a.y, b.y),
      band: 'unknown',
      widthPx: 2.5,
      planned: false,
      discovered: true,
      testId: `topology-discovered-${d.radioAId}-${d.radioBId}`,
    });
  });
  return out;
}
