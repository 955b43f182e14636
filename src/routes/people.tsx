import { lazy, Suspense, useState } from 'react';
import { ROLES } from '../../shared/enums';
import { Button } from '../components/button';
import { ListBody } from '../components/list-body';
import { FilterSelect, ListToolbar, sortChoices } from '../components/list-toolbar';
import { PageHeader } from '../components/page-header';
import { usePeople } from '../features/people/api/people';
import { PEOPLE_SORT_FIELDS, PeopleTable } from '../features/people/components/people-table';
import { capitalise } from '../lib/format';
import { useListParams } from '../lib/list-params';
import { peopleList } from '../app/page-data';
import { useInlineForm } from '../lib/use-inline-form';
import { Loading } from '../components/query-state';

// The forms (with the form library and the shared schemas) load when one is opened, not with the list.
const InviteForm = lazy(() => import('../features/people/components/invite-form').then((m) => ({ default: m.InviteForm })));
const PersonForm = lazy(() => import('../features/people/components/person-form').then((m) => ({ default: m.PersonForm })));

export function PeoplePage() {
  const list = useListParams(peopleList.filters, peopleList.sort);
  const people = usePeople(list.apiParams);
  const adding = useInlineForm();
  const inviting = useInlineForm();
  const [added, setAdded] = useState<string | null>(null);
  const filtered = Boolean(list.q || list.filters.role);

  return (
    <>
      <PageHeader
        title="People"
        subtitle="Everyone with a sign-in, and what they may do."
        actions={
          people.data?.abilities?.create &&
          !adding.open &&
          !inviting.open && (
            <>
              <Button
                {...inviting.triggerProps}
                variant="primary"
                onClick={() => {
                  setAdded(null);
                  inviting.show();
                }}
              >
                Invite by e-mail
              </Button>
              <Button
                {...adding.triggerProps}
                onClick={() => {
                  setAdded(null);
                  adding.show();
                }}
              >
                Add with a password
              </Button>
            </>
          )
        }
      />
      <p aria-live="polite" className="empty:hidden mb-4 rounded-md border border-line bg-accent-soft px-3 py-2 text-sm">
        {added ?? ''}
      </p>
      {inviting.open && (
        <div {...inviting.regionProps} className="mb-6">
          <h2 className="mb-2 text-lg font-semibold">Invite someone</h2>
          <Suspense fallback={<Loading label="Loading…" />}>
            <InviteForm
              onSent={(person) => {
                inviting.hide();
                setAdded(`Invitation sent to ${person.email}. The link works once, until ${new Date(person.invitationExpiresAt).toLocaleString()}.`);
              }}
              onCancel={inviting.hide}
            />
          </Suspense>
        </div>
      )}
      {adding.open && (
        <div {...adding.regionProps} className="mb-6">
          <h2 className="mb-2 text-lg font-semibold">New person</h2>
          <Suspense fallback={<Loading label="Loading…" />}>
            <PersonForm
              onSaved={(person) => {
                adding.hide();
                setAdded(`${person.name} can now sign in as ${person.role}.`);
              }}
              onCancel={adding.hide}
            />
          </Suspense>
        </div>
      )}
      <ListToolbar
        q={list.q}
        onSearch={(q) => list.update({ q }, { replace: true })}
        searchLabel="Search by name or e-mail"
        sortOptions={sortChoices(PEOPLE_SORT_FIELDS)}
        sort={list.sort}
        onSort={(sort) => list.update({ sort })}
      >
        <FilterSelect
          label="Role"
          value={list.filters.role}
          onChange={(role) => list.update({ role })}
          options={ROLES.map((role) => ({ value: role, label: capitalise(role) }))}
        />
      </ListToolbar>
      <ListBody
        query={people}
        noun="people"
        emptyTitle={filtered ? 'No one matches' : 'No people yet'}
        emptyHint={filtered ? 'Try another role or a shorter search.' : undefined}
        onPage={(page) => list.update({ page })}
        onPageSize={(pageSize) => list.update({ pageSize })}
      >
        {(rows) => <PeopleTable people={rows} sort={list.sort} onSort={(sort) => list.update({ sort })} />}
      </ListBody>
    </>
  );
}
