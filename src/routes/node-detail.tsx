import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { Button } from '../components/button';
import { NotYetReporting } from '../components/details';
import { EmptyState } from '../components/empty-state';
import { FormMessage } from '../components/form-field';
import { PageHeader, Section } from '../components/page-header';
import { LoadError, Loading } from '../components/query-state';
import { StateBadge } from '../components/state-badge';
import { useLinks } from '../features/links/api/links';
import { LinksTable } from '../features/links/components/links-table';
import { useNeighbourhoods } from '../features/neighbourhoods/api/neighbourhoods';
import { useDeleteNode, useNode, useNodes } from '../features/nodes/api/nodes';
import { NodeForm } from '../features/nodes/components/node-form';
import { NodeSummary } from '../features/nodes/components/node-summary';
import { useRadios } from '../features/radios/api/radios';
import { RadiosTable } from '../features/radios/components/radios-table';
import { useSites } from '../features/sites/api/sites';
import { ApiError } from '../lib/api';
import { paths } from '../lib/paths';
import { ALL_BY_NAME, ALL_ROWS, idFromParam, nameLookup, toOptions } from '../lib/resource';
import { NotFoundPage } from './not-found';

export function NodeDetailPage() {
  const nodeId = idFromParam(useParams().nodeId);
  if (nodeId === null) return <NotFoundPage what="node" />;
  return <NodeDetail nodeId={nodeId} />;
}

function NodeDetail({ nodeId }: { nodeId: number }) {
  const navigate = useNavigate();
  const [editing, setEditing] = useState(false);
  const node = useNode(nodeId);
  const sites = useSites(ALL_BY_NAME);
  const neighbourhoods = useNeighbourhoods(ALL_BY_NAME);
  const radios = useRadios({ nodeId, ...ALL_ROWS });
  const links = useLinks({ nodeId, ...ALL_ROWS });
  const allNodes = useNodes(ALL_BY_NAME);
  const remove = useDeleteNode(nodeId);

  if (node.isPending) return <Loading label="Loading the node…" />;
  if (node.error instanceof ApiError && node.error.status === 404) return <NotFoundPage what="node" />;
  if (node.isError) return <LoadError error={node.error} />;

  const record = node.data;
  const siteName = nameLookup(sites.data?.data).get(record.siteId) ?? `#${record.siteId}`;
  const neighbourhoodName = nameLookup(neighbourhoods.data?.data).get(record.neighbourhoodId) ?? `#${record.neighbourhoodId}`;

  function confirmDelete() {
    if (!window.confirm(`Remove the node “${record.name}” with its radios and links? This cannot be undone.`)) return;
    remove.mutate(undefined, { onSuccess: () => navigate(paths.nodes.to(), { replace: true }) });
  }

  return (
    <>
      <PageHeader
        documentTitle={record.name}
        title={
          <span className="inline-flex flex-wrap items-center gap-3">
            {record.name} <StateBadge state={record.state} />
          </span>
        }
        subtitle={
          <>
            Node at{' '}
            <Link to={paths.siteDetail.to(record.siteId)} className="text-accent hover:underline">
              {siteName}
            </Link>
          </>
        }
        actions={
          !editing && (
            <>
              {record.abilities.update && (
                <Button variant="primary" onClick={() => setEditing(true)}>
                  Edit node
                </Button>
              )}
              {record.abilities.delete && (
                <Button variant="danger" onClick={confirmDelete} disabled={remove.isPending}>
                  Remove node
                </Button>
              )}
            </>
          )
        }
      />
      <FormMessage message={remove.error instanceof ApiError ? remove.error.message : remove.error ? 'Could not remove the node.' : null} />
      {editing ? (
        <NodeForm
          node={record}
          siteOptions={toOptions(sites.data?.data)}
          neighbourhoodOptions={toOptions(neighbourhoods.data?.data)}
          onSaved={() => setEditing(false)}
          onCancel={() => setEditing(false)}
        />
      ) : (
        <NodeSummary node={record} siteName={siteName} neighbourhoodName={neighbourhoodName} />
      )}

      <Section title="Radios">
        {radios.isPending ? (
          <Loading label="Loading radios…" />
        ) : radios.isError ? (
          <LoadError error={radios.error} />
        ) : radios.data.data.length === 0 ? (
          <EmptyState title="No radios recorded for this node" />
        ) : (
          <RadiosTable radios={radios.data.data} />
        )}
      </Section>

      <Section title="Links">
        {links.isPending ? (
          <Loading label="Loading links…" />
        ) : links.isError ? (
          <LoadError error={links.error} />
        ) : links.data.data.length === 0 ? (
          <EmptyState title="No links to or from this node" />
        ) : (
          <LinksTable links={links.data.data} nodeId={record.id} nodeNames={nameLookup(allNodes.data?.data)} />
        )}
      </Section>

      <Section title="Signal and throughput">
        <NotYetReporting title="Charts">Signal, noise, throughput and latency over time appear here once this node reports.</NotYetReporting>
      </Section>
      <Section title="Outages">
        <NotYetReporting title="Outage history">Each time this node went down, for how long, and who acknowledged it, appears here once outage tracking runs.</NotYetReporting>
      </Section>
    </>
  );
}
