import { useState } from 'react';
import { ROLES } from '../../shared/enums';
import { Button } from '../components/button';
import { ListBody } from '../components/list-body';
import { FilterSelect, ListToolbar, sortChoices } from '../components/list-toolbar';
import { PageHeader } from '../components/page-header';
import { usePeople } from '../features/people/api/people';
import { PEOPLE_SORT_FIELDS, PeopleTable } from '../features/people/components/people-table';
import { InviteForm } from '../features/people/components/invite-form';
import { PersonForm } from '../features/people/components/person-form';
import { capitalise } from '../lib/format';
import { useListParams } from '../lib/list-params';

export function PeoplePage() {
  const list = useListParams(['role'], 'name');
  const people = usePeople(list.apiParams);
  const [adding, setAdding] = useState(false);
  const [inviting, setInviting] = useState(false);
  const [added, setAdded] = useState<string | null>(null);
  const filtered = Boolean(list.q || list.filters.role);

  return (
    <>
      <PageHeader
        title="People"
        subtitle="Everyone with a sign-in, and what they may do."
        actions={
          people.data?.abilities?.create &&
          !adding &&
          !inviting && (
            <>
              <Button
                variant="primary"
                onClick={() => {
                  setAdded(null);
                  setInviting(true);
                }}
              >
                Invite by e-mail
              </Button>
              <Button
                onClick={() => {
                  setAdded(null);
                  setAdding(true);
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
      {inviting && (
        <div className="mb-6">
          <h2 className="mb-2 text-lg font-semibold">Invite someone</h2>
          <InviteForm
            onSent={(person) => {
              setInviting(false);
              setAdded(`Invitation sent to ${person.email}. The link works once, until ${new Date(person.invitationExpiresAt).toLocaleString()}.`);
            }}
            onCancel={() => setInviting(false)}
          />
        </div>
      )}
      {adding && (
        <div className="mb-6">
          <h2 className="mb-2 text-lg font-semibold">New person</h2>
          <PersonForm
            onSaved={(person) => {
              setAdding(false);
              setAdded(`${person.name} can now sign in as ${person.role}.`);
            }}
            onCancel={() => setAdding(false)}
          />
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
        <FilterSelect label="Role" value={list.filters.role} onChange={(role) => list.update({ role })} options={ROLES.map((role) => ({ value: role, label: capitalise(role) }))} />
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
