import { Link, useNavigate, useParams } from 'react-router-dom';
import { Button, ButtonLink } from '../components/button';
import { EmptyState } from '../components/empty-state';
import { FormMessage } from '../components/form-field';
import { PageHeader, Section } from '../components/page-header';
import { LoadError, Loading } from '../components/query-state';
import { StateBadge } from '../components/state-badge';
import { MaintenanceWindows } from '../features/alerts/components/maintenance-windows';
import { useLinks } from '../features/links/api/links';
import { LinkEditor } from '../features/links/components/link-editor';
import { LinksTable } from '../features/links/components/links-table';
import { useNeighbourhoods } from '../features/neighbourhoods/api/neighbourhoods';
import { useDeleteNode, useNode, useNodes } from '../features/nodes/api/nodes';
import { AgentDownload } from '../features/nodes/components/agent-download';
import { NodeAvailability } from '../features/nodes/components/node-availability';
import { NodeCharts } from '../features/nodes/components/node-charts';
import { DriftList, LatestFigures, ReportedRadios } from '../features/nodes/components/node-figures';
import { NodeForm } from '../features/nodes/components/node-form';
import { NodeSummary } from '../features/nodes/components/node-summary';
import { useOutages } from '../features/outages/api/outages';
import { OutagesTable } from '../features/outages/components/outages-table';
import { LinkHealthCard } from '../features/planning/components/link-health-panel';
import { NodeRadios } from '../features/radios/components/node-radios';
import { channelRegionOf } from '../lib/channel-options';
import { useNetworkSettings } from '../features/planning/api/planning';
import { useSites } from '../features/sites/api/sites';
import { useTopology } from '../features/topology/api/topology';
import { AirFindings } from '../features/topology/components/air-findings';
import { ApiError } from '../lib/api';
import { paths } from '../lib/paths';
import { useInlineForm } from '../lib/use-inline-form';
import { ALL_BY_NAME, ALL_ROWS, idFromParam, nameLookup, toOptions } from '../lib/resource';
import { NotFoundPage } from './not-found';

export function NodeDetailPage() {
  const nodeId = idFromParam(useParams().nodeId);
  if (nodeId === null) return <NotFoundPage what="node" />;
  return <NodeDetail nodeId={nodeId} />;
}

function NodeDetail({ nodeId }: { nodeId: number }) {
  const navigate = useNavigate();
  const editing = useInlineForm();
  const node = useNode(nodeId);
  const sites = useSites(ALL_BY_NAME);
  const neighbourhoods = useNeighbourhoods(ALL_BY_NAME);
  const settings = useNetworkSettings();
  const region = channelRegionOf(settings.data?.region);
  const links = useLinks({ nodeId, ...ALL_ROWS });
  const allNodes = useNodes(ALL_BY_NAME);
  const remove = useDeleteNode(nodeId);
  const outages = useOutages({ nodeId, page: 1, pageSize: 10, sort: '-startedAt' });
  const topology = useTopology();

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
          !editing.open && (
            <>
              <ButtonLink to={paths.topology.to(record.id)}>Show on the map</ButtonLink>
              {record.abilities.update && <ButtonLink to={paths.provisioningSheet.to(record.id)}>Provisioning sheet</ButtonLink>}
              {record.abilities.update && (
                <Button {...editing.triggerProps} variant="primary" onClick={editing.show}>
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
      {editing.open ? (
        <div {...editing.regionProps}>
          <NodeForm
            node={record}
            siteOptions={toOptions(sites.data?.data)}
            neighbourhoodOptions={toOptions(neighbourhoods.data?.data)}
            onSaved={editing.hide}
            onCancel={editing.hide}
          />
        </div>
      ) : (
        <NodeSummary node={record} siteName={siteName} neighbourhoodName={neighbourhoodName} />
      )}

      <Section title="Latest report">
        <LatestFigures node={record} />
        <div className="mt-3">
          <ReportedRadios node={record} />
        </div>
      </Section>

      <Section title="Drift from the inventory">
        <DriftList node={record} />
      </Section>

      <Section title="Availability">
        <NodeAvailability nodeId={record.id} />
      </Section>

      <div className="mt-8">
        <MaintenanceWindows nodeId={record.id} />
      </div>

      <Section title="Signal and throughput">
        <NodeCharts nodeId={record.id} />
      </Section>

      <Section
        title="Outages"
        actions={
          (outages.data?.pagination.total ?? 0) > 10 && (
            <Link to={paths.outages.to({ nodeId: record.id })} className="text-sm font-medium text-accent hover:underline">
              All {outages.data?.pagination.total} outages
            </Link>
          )
        }
      >
        {outages.isPending ? (
          <Loading label="Loading outages…" />
        ) : outages.isError ? (
          <LoadError error={outages.error} />
        ) : outages.data.data.length === 0 ? (
          <EmptyState title="No outages recorded">
            {record.lastSeenAt ? 'This node has not missed its reports so far.' : 'Outages are tracked once the node reports.'}
          </EmptyState>
        ) : (
          <OutagesTable outages={outages.data.data} showNode={false} testId="node-outages-table" />
        )}
      </Section>

      <Section title="Radios">
        <NodeRadios nodeId={record.id} canManage={record.abilities.update} region={region} />
      </Section>

      <Section title="Links">
        <LinkEditor nodeId={record.id} canManage={record.abilities.update}>
          {(actionsFor) =>
            links.isPending ? (
              <Loading label="Loading links…" />
            ) : links.isError ? (
              <LoadError error={links.error} />
            ) : links.data.data.length === 0 ? (
              <EmptyState title="No links to or from this node" />
            ) : (
              <>
                <LinksTable links={links.data.data} nodeId={record.id} nodeNames={nameLookup(allNodes.data?.data)} actions={(l) => actionsFor(l.id)} />
                <div className="mt-3 grid gap-3 md:grid-cols-2">
                  {links.data.data
                    .filter((l) => l.status === 'live')
                    .map((l) => (
                      <div key={l.id} className="min-w-0">
                        <LinkHealthCard linkId={l.id} />
                      </div>
                    ))}
                </div>
              </>
            )
          }
        </LinkEditor>
        {topology.data && <AirFindings topology={topology.data} names={nameLookup(allNodes.data?.data)} nodeId={record.id} />}
      </Section>

      {record.abilities.update && (
        <Section title="Heartbeat agent">
          <AgentDownload nodeId={record.id} nodeName={record.name} hasReported={record.lastSeenAt !== null} />
        </Section>
      )}
    </>
  );
}
