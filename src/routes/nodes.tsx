import { lazy, Suspense } from 'react';
import { useNavigate } from 'react-router-dom';
import { NODE_STATES } from '../../shared/enums';
import { Button, ButtonLink } from '../components/button';
import { ListBody } from '../components/list-body';
import { FilterSelect, ListToolbar, sortChoices } from '../components/list-toolbar';
import { PageHeader } from '../components/page-header';
import { stateWord } from '../components/state-badge';
import { ExportButton } from '../features/csv/components/export-button';
import { useNeighbourhoods } from '../features/neighbourhoods/api/neighbourhoods';
import { useNodes } from '../features/nodes/api/nodes';
import { NODE_SORT_FIELDS, NodesTable } from '../features/nodes/components/nodes-table';
import { useSites } from '../features/sites/api/sites';
import { useListParams } from '../lib/list-params';
import { nodeList } from '../app/page-data';
import { paths } from '../lib/paths';
import { useInlineForm } from '../lib/use-inline-form';
import { ALL_BY_NAME, nameLookup, toOptions } from '../lib/resource';
import { Loading } from '../components/query-state';

// The form (with the form library and the shared schemas) loads when "Add node" is pressed, not with the list.
const NodeForm = lazy(() => import('../features/nodes/components/node-form').then((m) => ({ default: m.NodeForm })));

export function NodesPage() {
  const navigate = useNavigate();
  const list = useListParams(nodeList.filters, nodeList.sort);
  const nodes = useNodes(list.apiParams);
  const sites = useSites(ALL_BY_NAME);
  const neighbourhoods = useNeighbourhoods(ALL_BY_NAME);
  const adding = useInlineForm();
  const filtered = Boolean(list.q || list.filters.state || list.filters.neighbourhoodId || list.filters.siteId);

  return (
    <>
      <PageHeader
        title="Nodes"
        subtitle="Routers on the roofs, and how each one is doing."
        actions={
          <>
            <ExportButton table="nodes" />
            {nodes.data?.abilities?.create && !adding.open && (
              <>
                <ButtonLink to={paths.imports.to('nodes')}>Import CSV</ButtonLink>
                <Button {...adding.triggerProps} variant="primary" onClick={adding.show}>
                  Add node
                </Button>
              </>
            )}
          </>
        }
      />
      {adding.open && (
        <div {...adding.regionProps} className="mb-6">
          <h2 className="mb-2 text-lg font-semibold">New node</h2>
          <Suspense fallback={<Loading label="Loading…" />}>
            <NodeForm
              siteOptions={toOptions(sites.data?.data)}
              neighbourhoodOptions={toOptions(neighbourhoods.data?.data)}
              onSaved={(node) => navigate(paths.nodeDetail.to(node.id))}
              onCancel={adding.hide}
            />
          </Suspense>
        </div>
      )}
      <ListToolbar
        q={list.q}
        onSearch={(q) => list.update({ q }, { replace: true })}
        searchLabel="Search nodes"
        sortOptions={sortChoices(NODE_SORT_FIELDS)}
        sort={list.sort}
        onSort={(sort) => list.update({ sort })}
      >
        <FilterSelect
          label="State"
          value={list.filters.state}
          onChange={(state) => list.update({ state })}
          options={NODE_STATES.map((state) => ({ value: state, label: stateWord(state) }))}
        />
        <FilterSelect
          label="Neighbourhood"
          value={list.filters.neighbourhoodId}
          onChange={(neighbourhoodId) => list.update({ neighbourhoodId })}
          options={toOptions(neighbourhoods.data?.data)}
        />
        <FilterSelect label="Site" value={list.filters.siteId} onChange={(siteId) => list.update({ siteId })} options={toOptions(sites.data?.data)} />
      </ListToolbar>
      <ListBody
        query={nodes}
        noun="nodes"
        emptyTitle={filtered ? 'No nodes match' : 'No nodes yet'}
        emptyHint={filtered ? 'Try another state, neighbourhood or site, or a shorter search.' : 'Nodes you can see will be listed here.'}
        onPage={(page) => list.update({ page })}
        onPageSize={(pageSize) => list.update({ pageSize })}
      >
        {(rows) => (
          <NodesTable
            nodes={rows}
            siteNames={nameLookup(sites.data?.data)}
            neighbourhoodNames={nameLookup(neighbourhoods.data?.data)}
            sort={list.sort}
            onSort={(sort) => list.update({ sort })}
          />
        )}
      </ListBody>
    </>
  );
}
