import { lazy, Suspense, useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import { NODE_STATES, type NodeState } from '../../shared/enums';
import { EmptyState } from '../components/empty-state';
import { PageHeader } from '../components/page-header';
import { LoadError, Loading } from '../components/query-state';
import { useNeighbourhoods } from '../features/neighbourhoods/api/neighbourhoods';
import { useNode } from '../features/nodes/api/nodes';
import { useTopology, useTopologyNeighbourhoods } from '../features/topology/api/topology';
import { NeighbourhoodPreview } from '../features/topology/components/neighbourhood-preview';
import { AirFindings } from '../features/topology/components/air-findings';
import { NodeLinks } from '../features/topology/components/node-links';
import { TopologyLegend } from '../features/topology/components/topology-legend';
import { TopologyView } from '../features/topology/components/topology-view';
import { useSamePlaces } from '../features/topology/utils/stable';
import type { TopologyLink, TopologyNode } from '../features/topology/api/topology';
import type { GraphFilters } from '../features/topology/utils/flow-elements';
import { ALL_BY_NAME, idFromParam, toOptions } from '../lib/resource';

// What opens with a chosen node (its figures, its links and the link form, with the form library and the shared schemas
// under it) loads when a node is first chosen, not with the map: most visits only look.
const NodeQuickLook = lazy(() => import('../features/nodes/components/node-quick-look').then((m) => ({ default: m.NodeQuickLook })));
const LinkEditor = lazy(() => import('../features/links/components/link-editor').then((m) => ({ default: m.LinkEditor })));

function stateFrom(text: string | null): NodeState | undefined {
  return NODE_STATES.find((state) => state === text);
}

/** The selected node's links on the map, with adding, editing and removing them for those who manage the node. */
function MapLinkTools({ node, links, names }: { node: TopologyNode; links: TopologyLink[]; names: Map<number, string> }) {
  const record = useNode(node.id);
  return (
    <LinkEditor nodeId={node.id} canManage={record.data?.abilities.update ?? false}>
      {(actionsFor) => <NodeLinks node={node} links={links} names={names} actions={actionsFor} />}
    </LinkEditor>
  );
}

const NO_NODES: TopologyNode[] = [];

export function TopologyPage() {
  const [params, setParams] = useSearchParams();
  const topology = useTopology();
  // Asked alongside the graph; only drawn while the graph is still on its way.
  const preview = useTopologyNeighbourhoods(topology.isPending);
  const neighbourhoods = useNeighbourhoods(ALL_BY_NAME);

  const neighbourhoodId = idFromParam(params.get('neighbourhoodId') ?? undefined) ?? undefined;
  const state = stateFrom(params.get('state'));
  const filters = useMemo<GraphFilters>(() => ({ neighbourhoodId, state }), [neighbourhoodId, state]);
  const selectedId = idFromParam(params.get('node') ?? undefined);

  // Filters and the chosen node live in the address, so a view can be shared or bookmarked.
  const change = useCallback(
    (changes: Record<string, string | undefined>) =>
      setParams(
        (previous) => {
          const next = new URLSearchParams(previous);
          for (const [key, value] of Object.entries(changes)) {
            if (value === undefined) next.delete(key);
            else next.set(key, value);
          }
          return next;
        },
        { replace: true },
      ),
    [setParams],
  );
  const onFilters = useCallback(
    (next: GraphFilters) => change({ neighbourhoodId: next.neighbourhoodId === undefined ? undefined : String(next.neighbourhoodId), state: next.state }),
    [change],
  );
  const onSelect = useCallback((id: number | null) => change({ node: id === null ? undefined : String(id) }), [change]);

  const selected = selectedId === null ? undefined : topology.data?.nodes.find((n) => n.id === selectedId);
  // Keyed on names and places only: live state changes must not rebuild it 60 times a second.
  const placed = useSamePlaces(topology.data?.nodes ?? NO_NODES);
  const nodeNames = useMemo(() => new Map(placed.map((n) => [n.id, n.name])), [placed]);

  return (
    <>
      <PageHeader title="Network map" subtitle="Nodes at their sites, links drawn with their margin. Changes appear as they happen." />
      {topology.isPending ? (
        <>
          <Loading label="Loading the network map…" />
          {preview.data && preview.data.length > 0 && <NeighbourhoodPreview hoods={preview.data} />}
        </>
      ) : topology.isError ? (
        <LoadError error={topology.error} />
      ) : topology.data.nodes.length === 0 ? (
        <EmptyState title="No nodes to draw">Nodes you can see appear here, placed by their site's coordinates.</EmptyState>
      ) : (
        <>
          <TopologyView
            topology={topology.data}
            neighbourhoodOptions={toOptions(neighbourhoods.data?.data)}
            filters={filters}
            onFilters={onFilters}
            selectedId={selectedId}
            onSelect={onSelect}
            panel={
              selected && (
                <Suspense fallback={<Loading label="Loading…" />}>
                  <div className="space-y-3">
                    <NodeQuickLook key={selected.id} nodeId={selected.id} openOutageId={selected.openOutageId} onClose={() => onSelect(null)} />
                    <MapLinkTools node={selected} links={topology.data.links} names={nodeNames} />
                  </div>
                </Suspense>
              )
            }
          />
          <AirFindings topology={topology.data} names={nodeNames} />
          <div className="mt-4">
            <TopologyLegend />
          </div>
        </>
      )}
    </>
  );
}
