import { useState } from 'react';
import { useNavigate, useParams } from 'react-router-dom';
import { Button, ButtonLink } from '../components/button';
import { EmptyState } from '../components/empty-state';
import { FormMessage } from '../components/form-field';
import { PageHeader, Section } from '../components/page-header';
import { LoadError, Loading } from '../components/query-state';
import { useCurrentUser } from '../features/auth/api/session';
import { HistorySection } from '../features/history/components/history-section';
import { useNeighbourhoods } from '../features/neighbourhoods/api/neighbourhoods';
import { useNodes } from '../features/nodes/api/nodes';
import { NodesTable } from '../features/nodes/components/nodes-table';
import { SitePhotos } from '../features/photos/components/site-photos';
import { useDeleteSite, useHostCandidates, useSite } from '../features/sites/api/sites';
import { InviteHostForm } from '../features/sites/components/invite-host-form';
import { SiteForm } from '../features/sites/components/site-form';
import { SiteSummary } from '../features/sites/components/site-summary';
import { ApiError } from '../lib/api';
import { paths } from '../lib/paths';
import { useInlineForm } from '../lib/use-inline-form';
import { ALL_BY_NAME, idFromParam, nameLookup, toOptions } from '../lib/resource';
import { NotFoundPage } from './not-found';

export function SiteDetailPage() {
  const siteId = idFromParam(useParams().siteId);
  if (siteId === null) return <NotFoundPage what="site" />;
  return <SiteDetail siteId={siteId} />;
}

function SiteDetail({ siteId }: { siteId: number }) {
  const navigate = useNavigate();
  const user = useCurrentUser();
  const editing = useInlineForm();
  const [inviting, setInviting] = useState(false);
  const [invited, setInvited] = useState<string | null>(null);
  const site = useSite(siteId);
  const neighbourhoods = useNeighbourhoods(ALL_BY_NAME);
  const nodes = useNodes({ siteId, ...ALL_BY_NAME });
  const people = useHostCandidates(editing && (user?.role === 'admin' || user?.role === 'operator'));
  const remove = useDeleteSite(siteId);

  if (site.isPending) return <Loading label="Loading the site…" />;
  if (site.error instanceof ApiError && site.error.status === 404) return <NotFoundPage what="site" />;
  if (site.isError) return <LoadError error={site.error} />;

  const record = site.data;
  const neighbourhoodNames = nameLookup(neighbourhoods.data?.data);
  const neighbourhoodName = neighbourhoodNames.get(record.neighbourhoodId) ?? `#${record.neighbourhoodId}`;

  function confirmDelete() {
    if (!window.confirm(`Remove the site “${record.name}”? This cannot be undone.`)) return;
    remove.mutate(undefined, { onSuccess: () => navigate(paths.sites.to(), { replace: true }) });
  }

  return (
    <>
      <PageHeader
        title={record.name}
        subtitle="Site"
        actions={
          !editing.open && (
            <>
              {record.abilities.update && (
                <Button {...editing.triggerProps} variant="primary" onClick={editing.show}>
                  Edit site
                </Button>
              )}
              {record.abilities.delete && (
                <Button variant="danger" onClick={confirmDelete} disabled={remove.isPending}>
                  Remove site
                </Button>
              )}
            </>
          )
        }
      />
      <FormMessage message={remove.error instanceof ApiError ? remove.error.message : remove.error ? 'Could not remove the site.' : null} />
      {editing.open ? (
        <div {...editing.regionProps}>
          <SiteForm
            site={record}
            neighbourhoodOptions={toOptions(neighbourhoods.data?.data)}
            hostOptions={people.isSuccess ? toOptions(withCurrentHost(people.data.data, record.host)) : null}
            onSaved={editing.hide}
            onCancel={editing.hide}
          />
        </div>
      ) : (
        <SiteSummary site={record} neighbourhoodName={neighbourhoodName} />
      )}
      {record.abilities.update && (
        <div className="mt-4">
          {invited && (
            <p role="status" className="mb-2 text-sm">
              Invitation sent to {invited}; they become this site’s host once they accept it.
            </p>
          )}
          {inviting ? (
            <InviteHostForm
              siteId={record.id}
              onSent={(email) => {
                setInvited(email);
                setInviting(false);
              }}
              onCancel={() => setInviting(false)}
            />
          ) : (
            <Button onClick={() => setInviting(true)}>Invite a new host by e-mail</Button>
          )}
        </div>
      )}
      <Section
        title="Nodes at this site"
        actions={
          <ButtonLink to={`${paths.nodes.to()}?siteId=${record.id}`} variant="quiet">
            Open in the node list
          </ButtonLink>
        }
      >
        {nodes.isPending ? (
          <Loading label="Loading nodes…" />
        ) : nodes.isError ? (
          <LoadError error={nodes.error} />
        ) : nodes.data.data.length === 0 ? (
          <EmptyState title="No nodes at this site yet" />
        ) : (
          <NodesTable nodes={nodes.data.data} siteNames={new Map([[record.id, record.name]])} neighbourhoodNames={neighbourhoodNames} />
        )}
      </Section>
      <SitePhotos siteId={record.id} />
      <HistorySection table="sites" recordId={record.id} />
    </>
  );
}

/** The picker keeps the site's current host even when the caller could not choose them anew. */
function withCurrentHost(candidates: { id: number; name: string }[], host: { id: number; name: string } | null | undefined) {
  return host && !candidates.some((c) => c.id === host.id) ? [...candidates, { id: host.id, name: host.name }] : candidates;
}
