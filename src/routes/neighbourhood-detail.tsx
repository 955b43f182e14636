import { useState } from 'react';
import { useNavigate, useParams } from 'react-router-dom';
import { Button, ButtonLink } from '../components/button';
import { Details } from '../components/details';
import { EmptyState } from '../components/empty-state';
import { FormMessage } from '../components/form-field';
import { PageHeader, Section } from '../components/page-header';
import { LoadError, Loading } from '../components/query-state';
import { useCurrentUser } from '../features/auth/api/session';
import { HistorySection } from '../features/history/components/history-section';
import {
  useDeleteNeighbourhood,
  useNeighbourhood,
  useNeighbourhoods,
  useNeighbourhoodSummary,
  useUpdateNeighbourhood,
} from '../features/neighbourhoods/api/neighbourhoods';
import { BulkNodeAssign } from '../features/neighbourhoods/components/bulk-node-assign';
import { AvailabilityFigures, NeighbourhoodHosts, NeighbourhoodNodes } from '../features/neighbourhoods/components/neighbourhood-summary';
import { NeighbourhoodForm } from '../features/neighbourhoods/components/neighbourhood-form';
import { OperatorAssignment } from '../features/neighbourhoods/components/operator-assignment';
import { usePeople } from '../features/people/api/people';
import { useSites } from '../features/sites/api/sites';
import { SitesTable } from '../features/sites/components/sites-table';
import { ApiError } from '../lib/api';
import { formatDateTime } from '../lib/format';
import { paths } from '../lib/paths';
import { useInlineForm } from '../lib/use-inline-form';
import { ALL_BY_NAME, idFromParam, nameLookup } from '../lib/resource';
import { NotFoundPage } from './not-found';

export function NeighbourhoodDetailPage() {
  const neighbourhoodId = idFromParam(useParams().neighbourhoodId);
  if (neighbourhoodId === null) return <NotFoundPage what="neighbourhood" />;
  return <NeighbourhoodDetail neighbourhoodId={neighbourhoodId} />;
}

function NeighbourhoodDetail({ neighbourhoodId }: { neighbourhoodId: number }) {
  const navigate = useNavigate();
  const user = useCurrentUser();
  const editing = useInlineForm();
  const neighbourhood = useNeighbourhood(neighbourhoodId);
  const sites = useSites({ neighbourhoodId, ...ALL_BY_NAME });
  // Names of people come from the people list, which only admins may read.
  const operators = usePeople({ role: 'operator', ...ALL_BY_NAME }, { enabled: user?.role === 'admin' });
  const remove = useDeleteNeighbourhood(neighbourhoodId);
  const update = useUpdateNeighbourhood(neighbourhoodId);
  const summary = useNeighbourhoodSummary(neighbourhoodId);
  const [moving, setMoving] = useState(false);
  const allHoods = useNeighbourhoods({ ...ALL_BY_NAME, retired: 'all' }, { enabled: moving });

  if (neighbourhood.isPending) return <Loading label="Loading the neighbourhood…" />;
  if (neighbourhood.error instanceof ApiError && neighbourhood.error.status === 404) return <NotFoundPage what="neighbourhood" />;
  if (neighbourhood.isError) return <LoadError error={neighbourhood.error} />;

  const record = neighbourhood.data;
  const operatorRows = operators.data?.data ?? [];
  const assigned = operatorRows.filter((person) => record.operatorIds.includes(person.id));

  function toggleRetired() {
    const retiring = !record.retiredAt;
    if (retiring && !window.confirm(`Retire “${record.name}”? It stays with its history, but no longer appears where neighbourhoods are picked.`)) return;
    update.mutate({ retired: retiring });
  }

  function confirmDelete() {
    if (!window.confirm(`Remove the neighbourhood “${record.name}”? This cannot be undone.`)) return;
    remove.mutate(undefined, { onSuccess: () => navigate(paths.neighbourhoods.to(), { replace: true }) });
  }

  return (
    <>
      <PageHeader
        title={record.name}
        subtitle="Neighbourhood"
        actions={
          !editing.open && (
            <>
              {record.abilities.update && (
                <Button {...editing.triggerProps} variant="primary" onClick={editing.show}>
                  Edit neighbourhood
                </Button>
              )}
              {record.abilities.update && (
                <Button onClick={toggleRetired} disabled={update.isPending}>
                  {record.retiredAt ? 'Bring back' : 'Retire'}
                </Button>
              )}
              {record.abilities.delete && (
                <Button variant="danger" onClick={confirmDelete} disabled={remove.isPending}>
                  Remove neighbourhood
                </Button>
              )}
            </>
          )
        }
      />
      <FormMessage message={remove.error instanceof ApiError ? remove.error.message : remove.error ? 'Could not remove the neighbourhood.' : null} />
      {editing.open ? (
        <div {...editing.regionProps}>
          <NeighbourhoodForm neighbourhood={record} onSaved={editing.hide} onCancel={editing.hide} />
        </div>
      ) : (
        <Details
          items={[
            { label: 'Sites', value: record.siteCount },
            { label: 'Nodes', value: record.nodeCount },
            { label: 'Operators on the rota', value: record.operatorIds.length },
            { label: 'Last changed', value: formatDateTime(record.updatedAt) },
            ...(record.retiredAt ? [{ label: 'Retired', value: formatDateTime(record.retiredAt) }] : []),
            { label: 'Description', value: record.description ?? 'None' },
          ]}
        />
      )}

      <Section title="Availability">
        {summary.isSuccess ? (
          <AvailabilityFigures availability={summary.data.availability} />
        ) : summary.isError ? (
          <LoadError error={summary.error} />
        ) : (
          <Loading />
        )}
      </Section>

      <Section
        title="Nodes"
        actions={
          record.abilities.update && !record.retiredAt && <Button onClick={() => setMoving((m) => !m)}>{moving ? 'Done moving' : 'Move nodes here'}</Button>
        }
      >
        {moving && allHoods.isSuccess && (
          <div className="mb-4 rounded-md border border-line p-3">
            <BulkNodeAssign neighbourhoodId={record.id} neighbourhoodNames={nameLookup(allHoods.data.data)} />
          </div>
        )}
        {summary.isSuccess && <NeighbourhoodNodes nodes={summary.data.nodes} />}
      </Section>

      <Section title="Hosts">{summary.isSuccess && <NeighbourhoodHosts hosts={summary.data.hosts} />}</Section>

      <Section title="Operators">
        {operators.isSuccess && record.abilities.update ? (
          <OperatorAssignment neighbourhood={record} operators={operatorRows.map((person) => ({ id: person.id, name: person.name, email: person.email }))} />
        ) : operators.isSuccess ? (
          assigned.length === 0 ? (
            <EmptyState title="No operators assigned" />
          ) : (
            <ul className="list-inside list-disc text-sm">
              {assigned.map((person) => (
                <li key={person.id}>{person.name}</li>
              ))}
            </ul>
          )
        ) : summary.isSuccess && summary.data.operators.length > 0 ? (
          <ul className="list-inside list-disc text-sm">
            {summary.data.operators.map((person) => (
              <li key={person.id}>{person.name}</li>
            ))}
          </ul>
        ) : (
          <p className="text-sm text-muted">
            {record.operatorIds.length === 0
              ? 'No operators are assigned yet.'
              : `${record.operatorIds.length} operator${record.operatorIds.length === 1 ? ' is' : 's are'} on the rota here. An admin can change who.`}
          </p>
        )}
      </Section>

      <Section
        title="Sites"
        actions={
          <ButtonLink to={`${paths.nodes.to()}?neighbourhoodId=${record.id}`} variant="quiet">
            Nodes in this neighbourhood
          </ButtonLink>
        }
      >
        {sites.isPending ? (
          <Loading label="Loading sites…" />
        ) : sites.isError ? (
          <LoadError error={sites.error} />
        ) : sites.data.data.length === 0 ? (
          <EmptyState title="No sites in this neighbourhood yet" />
        ) : (
          <SitesTable sites={sites.data.data} neighbourhoodNames={new Map([[record.id, record.name]])} />
        )}
      </Section>
      <HistorySection table="neighbourhoods" recordId={record.id} />
    </>
  );
}
