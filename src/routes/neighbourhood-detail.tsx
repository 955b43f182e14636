import { useState } from 'react';
import { useNavigate, useParams } from 'react-router-dom';
import { Button, ButtonLink } from '../components/button';
import { Details } from '../components/details';
import { EmptyState } from '../components/empty-state';
import { FormMessage } from '../components/form-field';
import { PageHeader, Section } from '../components/page-header';
import { LoadError, Loading } from '../components/query-state';
import { useCurrentUser } from '../features/auth/api/session';
import { useDeleteNeighbourhood, useNeighbourhood } from '../features/neighbourhoods/api/neighbourhoods';
import { NeighbourhoodForm } from '../features/neighbourhoods/components/neighbourhood-form';
import { OperatorAssignment } from '../features/neighbourhoods/components/operator-assignment';
import { usePeople } from '../features/people/api/people';
import { useSites } from '../features/sites/api/sites';
import { SitesTable } from '../features/sites/components/sites-table';
import { ApiError } from '../lib/api';
import { formatDateTime } from '../lib/format';
import { paths } from '../lib/paths';
import { ALL_BY_NAME, idFromParam } from '../lib/resource';
import { NotFoundPage } from './not-found';

export function NeighbourhoodDetailPage() {
  const neighbourhoodId = idFromParam(useParams().neighbourhoodId);
  if (neighbourhoodId === null) return <NotFoundPage what="neighbourhood" />;
  return <NeighbourhoodDetail neighbourhoodId={neighbourhoodId} />;
}

function NeighbourhoodDetail({ neighbourhoodId }: { neighbourhoodId: number }) {
  const navigate = useNavigate();
  const user = useCurrentUser();
  const [editing, setEditing] = useState(false);
  const neighbourhood = useNeighbourhood(neighbourhoodId);
  const sites = useSites({ neighbourhoodId, ...ALL_BY_NAME });
  // Names of people come from the people list, which only admins may read.
  const operators = usePeople({ role: 'operator', ...ALL_BY_NAME }, { enabled: user?.role === 'admin' });
  const remove = useDeleteNeighbourhood(neighbourhoodId);

  if (neighbourhood.isPending) return <Loading label="Loading the neighbourhood…" />;
  if (neighbourhood.error instanceof ApiError && neighbourhood.error.status === 404) return <NotFoundPage what="neighbourhood" />;
  if (neighbourhood.isError) return <LoadError error={neighbourhood.error} />;

  const record = neighbourhood.data;
  const operatorRows = operators.data?.data ?? [];
  const assigned = operatorRows.filter((person) => record.operatorIds.includes(person.id));

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
          !editing && (
            <>
              {record.abilities.update && (
                <Button variant="primary" onClick={() => setEditing(true)}>
                  Edit neighbourhood
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
      {editing ? (
        <NeighbourhoodForm neighbourhood={record} onSaved={() => setEditing(false)} onCancel={() => setEditing(false)} />
      ) : (
        <Details
          items={[
            { label: 'Sites', value: record.siteCount },
            { label: 'Nodes', value: record.nodeCount },
            { label: 'Operators on the rota', value: record.operatorIds.length },
            { label: 'Last changed', value: formatDateTime(record.updatedAt) },
            { label: 'Description', value: record.description ?? 'None' },
          ]}
        />
      )}

      <Section title="Operators">
        {operators.isSuccess && record.abilities.update ? (
          <OperatorAssignment
            neighbourhood={record}
            operators={operatorRows.map((person) => ({ id: person.id, name: person.name, email: person.email }))}
          />
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
    </>
  );
}
