import { Background, Controls, MiniMap, ReactFlow, ReactFlowProvider, useReactFlow, useStore, type NodeMouseHandler } from '@xyflow/react';
import '@xyflow/react/dist/style.css';
import { useCallback, useEffect, useMemo, useRef, useState, type KeyboardEvent, type ReactNode, type RefObject } from 'react';
import { NODE_STATES, type NodeState } from '../../../../shared/enums';
import { FilterSelect } from '../../../components/list-toolbar';
import { stateWord } from '../../../components/state-badge';
import type { Topology, TopologyNode } from '../api/topology';
import { buildDiscoveredLines, buildFlowNodes, buildLinkLines, isShown, type GraphFilters } from '../utils/flow-elements';
import { layoutByCoordinates } from '../utils/layout';
import { LinkLayer } from './link-layer';
import { nodeScaleFor, SiteNode, type SiteFlowNode } from './site-node';
import { TopologySearch } from './topology-search';

// Outside the component: React Flow warns (and re-mounts every node) when this changes identity.
const NODE_TYPES = { site: SiteNode };
const STATE_FILL: Record<NodeState, string> = {
  online: '#009E73',
  degraded: '#E69F00',
  offline: '#D55E00',
  maintenance: '#F0E442',
  stranded: '#CC79A7',
  unknown: '#8a8f93',
};
const minimapColour = (node: SiteFlowNode) => STATE_FILL[node.data.state];
// Past this many nodes the first view is one part of the network, not all of it: drawing every
// node at once costs seconds, and at that size a whole-network view is only dots anyway.
const LARGE_GRAPH_NODES = 400;

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
  const canvas = useRef<HTMLDivElement>(null);

  // Only names and coordinates move the layout; a state change must not recompute it.
  const geometryKey = topology.nodes.map((n) => `${n.id}:${n.latitude}:${n.longitude}:${n.name}`).join('|');
  // eslint-disable-next-line react-hooks/exhaustive-deps -- keyed on geometry on purpose
  const positions = useMemo(() => layoutByCoordinates(topology.nodes), [geometryKey]);

  const shown = useMemo(() => topology.nodes.filter((n) => isShown(n, filters)), [topology.nodes, filters]);
  const shownKey = shown.map((n) => n.id).join(',');
  const nodes = useMemo(() => buildFlowNodes(shown, positions, { selectedId, highlightedId }, cache.current), [shown, positions, selectedId, highlightedId]);
  // eslint-disable-next-line react-hooks/exhaustive-deps -- keyed on which nodes are shown, not on their states
  const lines = useMemo(() => buildLinkLines(topology.links, new Set(shown.map((n) => n.id)), positions), [topology.links, shownKey, positions]);
  const discovered = useMemo(
    () => buildDiscoveredLines(topology.discoveredLinks ?? [], new Set(shownKey.split(',').map(Number)), positions),
    [topology.discoveredLinks, shownKey, positions],
  );
  const allLines = useMemo(() => (discovered.length ? [...lines, ...discovered] : lines), [lines, discovered]);

  const onNodeClick = useCallback<NodeMouseHandler<SiteFlowNode>>((_event, node) => onSelect(node.data.nodeId), [onSelect]);

  // Keyboard: Enter or Space on a focused node opens its panel, and focus moves there and is announced;
  // closing the panel puts focus back on the node in the graph.
  const aside = useRef<HTMLElement>(null);
  const [panelFocusWanted, setPanelFocusWanted] = useState(false);
  const [announcement, setAnnouncement] = useState('');
  const selectByKeyboard = useCallback(
    (nodeId: number) => {
      onSelect(nodeId);
      setPanelFocusWanted(true);
      const node = topology.nodes.find((n) => n.id === nodeId);
      if (node) setAnnouncement(`Showing ${node.name} at ${node.siteName}: ${stateWord(node.state)}.`);
    },
    [onSelect, topology.nodes],
  );
  const onCanvasKeyDown = (event: KeyboardEvent<HTMLDivElement>) => {
    if (event.key !== 'Enter' && event.key !== ' ') return;
    const id = (event.target as HTMLElement).closest<HTMLElement>('.react-flow__node')?.dataset.id;
    if (!id) return;
    event.preventDefault();
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
    (node: TopologyNode) => {
      if (!isShown(node, filters)) onFilters({});
      const position = positions.get(node.id);
      if (position) void flow.setCenter(position.x, position.y, { zoom: Math.max(flow.getZoom(), 1.4), duration: 500 });
      setHighlightedId(node.id);
      selectByKeyboard(node.id);
    },
    [filters, onFilters, positions, flow, selectByKeyboard],
  );

  // Decided once, on the first render: later filter changes must not move the view.
  const [start] = useState(() => {
    if (selectedId !== null && positions.has(selectedId)) return { at: positions.get(selectedId)!, zoom: 1.4 };
    if (shown.length <= LARGE_GRAPH_NODES) return null;
    const uplink = shown.find((n) => n.isUplink);
    return { at: (uplink && positions.get(uplink.id)) ?? { x: 0, y: 0 }, zoom: 0.9 };
  });
  const onInit = useCallback(() => {
    if (start) void flow.setCenter(start.at.x, start.at.y, { zoom: start.zoom });
  }, [start, flow]);

  return (
    <>
      <div className="mb-3 flex flex-wrap items-end gap-3">
        <TopologySearch nodes={topology.nodes} onFind={focusNode} />
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
        <p className="pb-1.5 text-sm text-muted" aria-live="polite">
          {shown.length === topology.nodes.length ? `${shown.length} nodes` : `${shown.length} of ${topology.nodes.length} nodes`}, {lines.length} links
        </p>
      </div>
      <div className="flex flex-col gap-3 lg:flex-row">
        {/* Keys bubble up here from the graph's own focusable nodes. */}
        <div ref={canvas} data-testid="topology" onKeyDown={onCanvasKeyDown} className="h-[60vh] min-h-[360px] min-w-0 overflow-hidden rounded-lg border border-line lg:h-[70vh] lg:flex-1">
          <ReactFlow
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
            <MiniMap<SiteFlowNode> className="max-lg:hidden" nodeColor={minimapColour} pannable zoomable ariaLabel="Overview of the whole graph" />
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
    </>
  );
}
