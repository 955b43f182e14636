import { Background, Controls, MiniMap, ReactFlow, ReactFlowProvider, useReactFlow, useStore, type NodeMouseHandler } from '@xyflow/react';
import '@xyflow/react/dist/style.css';
import { useCallback, useEffect, useLayoutEffect, useMemo, useRef, useState, type KeyboardEvent, type ReactNode, type RefObject } from 'react';
import { NODE_STATES, type NodeState } from '../../../../shared/enums';
import { Button } from '../../../components/button';
import { FilterSelect } from '../../../components/list-toolbar';
import { stateWord } from '../../../components/state-badge';
import { useMediaQuery } from '../../../lib/use-media-query';
import type { Topology, TopologyNode } from '../api/topology';
import { buildDiscoveredLines, buildFlowNodes, buildLinkLines, isShown, type GraphFilters } from '../utils/flow-elements';
import { layoutByCoordinates } from '../utils/layout';
import { sameOptions, samePlaces, useSameWhile } from '../utils/stable';
import { LinkLayer } from './link-layer';
import { nodeScaleFor, SiteNode, type SiteFlowNode } from './site-node';
import { TopologySearch } from './topology-search';
import { MARK_HEIGHT_PX, MARK_WIDTH_PX, NeighbourhoodMark, type NeighbourhoodFlowNode } from './neighbourhood-mark';
import { TopologyList } from './topology-list';
import { countsInWords, summariseNeighbourhoods, type NeighbourhoodSummary } from '../utils/neighbourhood-marks';

// Outside the component: React Flow warns (and re-mounts every node) when this changes identity.
const NODE_TYPES = { site: SiteNode, neighbourhood: NeighbourhoodMark };
type MapFlowNode = SiteFlowNode | NeighbourhoodFlowNode;
// The state colour tokens of styles.css; the class names also make the stylesheet carry every one of them.
const STATE_FILL_CLASS: Record<NodeState, string> = {
  online: 'fill-state-online',
  degraded: 'fill-state-degraded',
  offline: 'fill-state-offline',
  maintenance: 'fill-state-maintenance',
  stranded: 'fill-state-stranded',
  unknown: 'fill-state-unknown',
};
const minimapColour = (node: MapFlowNode) => (node.type === 'site' ? `var(--color-state-${node.data.state})` : 'var(--pp-line-strong)');
const minimapClass = (node: MapFlowNode) => (node.type === 'site' ? STATE_FILL_CLASS[node.data.state] : '');
// Tailwind's `lg`: the overview map is drawn from this width only (on a phone it would cover the graph).
const WIDE_SCREEN = '(min-width: 64rem)';
// Past this many nodes the map opens on one mark per neighbourhood: drawing every node at once
// costs seconds, and at that size a whole-network view is only dots anyway.
export const LARGE_GRAPH_NODES = 400;

/** Marks for the neighbourhoods that are folded, at their nodes' mean position. */
function buildMarks(summaries: NeighbourhoodSummary[], cache: Map<number, { key: string; flow: NeighbourhoodFlowNode }>): NeighbourhoodFlowNode[] {
  return summaries.map((hood) => {
    const key = `${hood.name}|${hood.total}|${hood.centre.x},${hood.centre.y}|${JSON.stringify(hood.counts)}`;
    const cached = cache.get(hood.neighbourhoodId);
    if (cached && cached.key === key) return cached.flow;
    const flow: NeighbourhoodFlowNode = {
      id: `hood-${hood.neighbourhoodId}`,
      type: 'neighbourhood',
      // The focus ring goes on the drawn mark (which keeps its screen size), not on the graph's small box.
      className: 'group focus-visible:outline-none!',
      position: hood.centre,
      width: MARK_WIDTH_PX,
      height: MARK_HEIGHT_PX,
      draggable: false,
      connectable: false,
      data: { neighbourhoodId: hood.neighbourhoodId, name: hood.name, total: hood.total, counts: hood.counts },
      ariaRole: 'button',
      ariaLabel: `${hood.name}, ${hood.total} nodes: ${countsInWords(hood.counts, stateWord)}. Show its nodes`,
    };
    cache.set(hood.neighbourhoodId, { key, flow });
    return flow;
  });
}

/**
 * Sets the node scale as a CSS variable on the canvas: one style change per zoom step instead of
 * re-rendering every node.
 */
function NodeScale({ target }: { target: RefObject<HTMLDivElement | null> }) {
  const scale = useStore((s) => nodeScaleFor(s.transform[2]));
  useEffect(() => target.current?.style.setProperty('--pp-node-scale', scale.toFixed(3)), [scale, target]);
  return null;
}

interface TopologyViewProps {
  topology: Topology;
  neighbourhoodOptions: { value: string; label: string }[];
  filters: GraphFilters;
  onFilters: (filters: GraphFilters) => void;
  selectedId: number | null;
  onSelect: (nodeId: number | null) => void;
  /** The selected node's details, beside the graph on wide screens and under it on phones. */
  panel?: ReactNode;
}

export function TopologyView(props: TopologyViewProps) {
  return (
    <ReactFlowProvider>
      <TopologyCanvas {...props} />
    </ReactFlowProvider>
  );
}

function TopologyCanvas({ topology, neighbourhoodOptions, filters, onFilters, selectedId, onSelect, panel }: TopologyViewProps) {
  const flow = useReactFlow();
  const [highlightedId, setHighlightedId] = useState<number | null>(null);
  const cache = useRef(new WeakMap());
  const markCache = useRef(new Map());
  const canvas = useRef<HTMLDivElement>(null);
  const listHeading = useRef<HTMLHeadingElement>(null);
  const wide = useMediaQuery(WIDE_SCREEN);

  // Only names and coordinates move the layout; a state change must not recompute it (nor the search's names).
  const placed = useSameWhile(topology.nodes, samePlaces);
  const positions = useMemo(() => layoutByCoordinates(placed), [placed]);
  const namedOptions = useSameWhile(neighbourhoodOptions, sameOptions);
  const hoodNames = useMemo(() => new Map(namedOptions.map((o) => [Number(o.value), o.label])), [namedOptions]);
  // Callbacks handed to memoised children read the newest nodes here, so they keep one identity across live events.
  const nodesNow = useRef(topology.nodes);
  useLayoutEffect(() => {
    nodesNow.current = topology.nodes;
  }, [topology.nodes]);

  // A big network opens folded: one mark per neighbourhood, one neighbourhood opened at a time.
  const [grouped, setGrouped] = useState(() => topology.nodes.length > LARGE_GRAPH_NODES);
  const [openHoodId, setOpenHoodId] = useState<number | null>(() =>
    selectedId === null ? null : (topology.nodes.find((n) => n.id === selectedId)?.neighbourhoodId ?? null),
  );
  const [fitHoodWanted, setFitHoodWanted] = useState(false);

  const matching = useMemo(() => topology.nodes.filter((n) => isShown(n, filters)), [topology.nodes, filters]);
  // Folded, only the open neighbourhood's nodes are drawn (or the one the filter names).
  const unfolded = (n: TopologyNode) => !grouped || filters.neighbourhoodId !== undefined || n.neighbourhoodId === openHoodId;
  // eslint-disable-next-line react-hooks/exhaustive-deps -- unfolded reads grouped, filters and openHoodId
  const shown = useMemo(() => matching.filter(unfolded), [matching, grouped, filters.neighbourhoodId, openHoodId]);
  const summaries = useMemo(() => summariseNeighbourhoods(matching, positions, hoodNames), [matching, positions, hoodNames]);
  const folded = useMemo(
    () => (grouped && filters.neighbourhoodId === undefined ? summaries.filter((h) => h.neighbourhoodId !== openHoodId) : []),
    [grouped, filters.neighbourhoodId, summaries, openHoodId],
  );
  const shownKey = shown.map((n) => n.id).join(',');
  // The caches keep React Flow's node objects stable between renders; they are read here on purpose.
  /* eslint-disable react-hooks/refs -- the node caches are render-time memo stores, never read for output alone */
  const siteNodes = useMemo(
    () => buildFlowNodes(shown, positions, { selectedId, highlightedId }, cache.current),
    [shown, positions, selectedId, highlightedId],
  );
  const marks = useMemo(() => buildMarks(folded, markCache.current), [folded]);
  /* eslint-enable react-hooks/refs */
  const nodes = useMemo<MapFlowNode[]>(() => (marks.length ? [...marks, ...siteNodes] : siteNodes), [marks, siteNodes]);
  // eslint-disable-next-line react-hooks/exhaustive-deps -- keyed on which nodes are shown, not on their states
  const lines = useMemo(() => buildLinkLines(topology.links, new Set(shown.map((n) => n.id)), positions), [topology.links, shownKey, positions]);
  const discovered = useMemo(
    () => buildDiscoveredLines(topology.discoveredLinks ?? [], new Set(shownKey.split(',').map(Number)), positions),
    [topology.discoveredLinks, shownKey, positions],
  );
  const allLines = useMemo(() => (discovered.length ? [...lines, ...discovered] : lines), [lines, discovered]);
  const nodesOf = useCallback((hoodId: number) => matching.filter((n) => n.neighbourhoodId === hoodId), [matching]);

  // One neighbourhood open at a time; opening another folds the first back into its mark.
  const toggleHood = useCallback((hoodId: number) => {
    setOpenHoodId((open) => (open === hoodId ? null : hoodId));
    setFitHoodWanted(true);
  }, []);
  useEffect(() => {
    if (!fitHoodWanted || !grouped) return;
    // eslint-disable-next-line react-hooks/set-state-in-effect -- a one-shot request flag, cleared as the fit starts
    setFitHoodWanted(false);
    if (openHoodId === null) return;
    const ids = shown.map((n) => ({ id: String(n.id) }));
    if (ids.length) void flow.fitView({ nodes: ids, padding: 0.2, duration: 400, maxZoom: 1.4 });
  }, [fitHoodWanted, grouped, openHoodId, shown, flow]);

  const onNodeClick = useCallback<NodeMouseHandler<MapFlowNode>>(
    (_event, node) => (node.type === 'neighbourhood' ? toggleHood(node.data.neighbourhoodId) : onSelect(node.data.nodeId)),
    [onSelect, toggleHood],
  );

  // Keyboard: Enter or Space on a focused node opens its panel, and focus moves there and is announced;
  // closing the panel puts focus back on the node in the graph. On a neighbourhood's mark they open it.
  const aside = useRef<HTMLElement>(null);
  const [panelFocusWanted, setPanelFocusWanted] = useState(false);
  const [announcement, setAnnouncement] = useState('');
  const selectByKeyboard = useCallback(
    (nodeId: number) => {
      onSelect(nodeId);
      setPanelFocusWanted(true);
      const node = nodesNow.current.find((n) => n.id === nodeId);
      if (node) setAnnouncement(`Showing ${node.name} at ${node.siteName}: ${stateWord(node.state)}.`);
    },
    [onSelect],
  );
  const onCanvasKeyDown = (event: KeyboardEvent<HTMLDivElement>) => {
    if (event.key !== 'Enter' && event.key !== ' ') return;
    const id = (event.target as HTMLElement).closest<HTMLElement>('.react-flow__node')?.dataset.id;
    if (!id) return;
    event.preventDefault();
    if (id.startsWith('hood-')) {
      const hood = summaries.find((h) => `hood-${h.neighbourhoodId}` === id);
      toggleHood(Number(id.slice(5)));
      if (hood) setAnnouncement(`Opened ${hood.name}: ${hood.total} nodes on the map.`);
      return;
    }
    selectByKeyboard(Number(id));
  };
  useEffect(() => {
    if (panelFocusWanted && panel && aside.current) {
      aside.current.focus();
      setPanelFocusWanted(false);
    }
  }, [panelFocusWanted, panel]);
  const previousSelected = useRef(selectedId);
  useEffect(() => {
    const before = previousSelected.current;
    previousSelected.current = selectedId;
    if (before === null || selectedId !== null) return;
    // The panel closed with focus inside it (now gone): return to the node it was about.
    const active = document.activeElement;
    if (active && active !== document.body && active.isConnected) return;
    const nodeEl = canvas.current?.querySelector<HTMLElement>(`.react-flow__node[data-id="${before}"]`);
    (nodeEl ?? canvas.current?.querySelector<HTMLElement>('.react-flow__node'))?.focus();
  }, [selectedId]);

  const focusNode = useCallback(
    (found: TopologyNode) => {
      // The search and the list may hold an older copy of the node: its state is read afresh.
      const node = nodesNow.current.find((n) => n.id === found.id) ?? found;
      if (!isShown(node, filters)) onFilters({});
      // In a folded map the node's neighbourhood opens first (and the one open before folds).
      if (grouped) setOpenHoodId(node.neighbourhoodId);
      const position = positions.get(node.id);
      if (position) void flow.setCenter(position.x, position.y, { zoom: Math.max(flow.getZoom(), 1.4), duration: 500 });
      setHighlightedId(node.id);
      selectByKeyboard(node.id);
    },
    [filters, onFilters, grouped, positions, flow, selectByKeyboard],
  );

  // Decided once, on the first render: later filter changes must not move the view.
  const [start] = useState(() => (selectedId !== null && positions.has(selectedId) ? { at: positions.get(selectedId)!, zoom: 1.4 } : null));
  const onInit = useCallback(() => {
    if (start) void flow.setCenter(start.at.x, start.at.y, { zoom: start.zoom });
  }, [start, flow]);
  const onGroupedChange = () => {
    setGrouped((g) => !g);
    // The whole network back in view once React Flow has the new set of nodes.
    requestAnimationFrame(() => void flow.fitView({ padding: 0.15, duration: 300 }));
  };

  const counted = shown.length === topology.nodes.length ? `${shown.length} nodes` : `${shown.length} of ${topology.nodes.length} nodes`;
  return (
    <>
      <div className="mb-3 flex flex-wrap items-end gap-3">
        <TopologySearch nodes={placed} onFind={focusNode} />
        <FilterSelect
          label="Neighbourhood"
          value={filters.neighbourhoodId === undefined ? undefined : String(filters.neighbourhoodId)}
          onChange={(value) => onFilters({ ...filters, neighbourhoodId: value ? Number(value) : undefined })}
          options={neighbourhoodOptions}
        />
        <FilterSelect
          label="State"
          value={filters.state}
          onChange={(value) => onFilters({ ...filters, state: value as NodeState | undefined })}
          options={NODE_STATES.map((state) => ({ value: state, label: stateWord(state) }))}
        />
        <Button aria-pressed={grouped} data-testid="topology-grouped" onClick={onGroupedChange}>
          Fold into neighbourhoods
        </Button>
        <p className="pb-1.5 text-sm text-muted" aria-live="polite">
          {counted} drawn{folded.length ? `, ${folded.length} neighbourhoods folded` : ''}, {lines.length} links
        </p>
      </div>
      <a
        href="#topology-list"
        onClick={(event) => {
          event.preventDefault();
          listHeading.current?.focus();
          listHeading.current?.scrollIntoView({ block: 'start' });
        }}
        className="sr-only rounded bg-surface px-2 py-1 text-sm text-ink focus:not-sr-only focus:mb-2 focus:inline-block"
      >
        Skip past the map to its list
      </a>
      <div className="flex flex-col gap-3 lg:flex-row">
        {/* Keys bubble up here from the graph's own focusable nodes. */}
        <div
          ref={canvas}
          data-testid="topology"
          onKeyDown={onCanvasKeyDown}
          className="h-[60vh] min-h-[360px] min-w-0 overflow-hidden rounded-lg border border-line lg:h-[70vh] lg:flex-1"
        >
          <ReactFlow<MapFlowNode>
            className="parapet-graph"
            nodes={nodes}
            nodeTypes={NODE_TYPES}
            nodeOrigin={[0.5, 0.5]}
            onNodeClick={onNodeClick}
            onPaneClick={() => setHighlightedId(null)}
            onInit={onInit}
            onlyRenderVisibleElements
            nodesDraggable={false}
            nodesConnectable={false}
            elementsSelectable={false}
            fitView={start === null}
            fitViewOptions={{ padding: 0.15 }}
            minZoom={0.05}
            maxZoom={3}
          >
            <Background gap={40} size={1} />
            <LinkLayer lines={allLines} />
            <NodeScale target={canvas} />
            <Controls showInteractive={false} />
            {wide && <MiniMap<MapFlowNode> nodeColor={minimapColour} nodeClassName={minimapClass} pannable zoomable ariaLabel="Overview of the whole graph" />}
          </ReactFlow>
        </div>
        {panel && (
          <aside ref={aside} tabIndex={-1} aria-label="Details of the selected node" className="w-full shrink-0 lg:w-80">
            {panel}
          </aside>
        )}
        <div role="status" className="sr-only">
          {announcement}
        </div>
      </div>
      <div id="topology-list">
        <TopologyList ref={listHeading} summaries={summaries} nodesOf={nodesOf} openHoodId={openHoodId} onToggleHood={toggleHood} onShowNode={focusNode} />
      </div>
    </>
  );
}
