import type { UserDto } from '../../../../shared/schemas/user';
import { DataTable, type Column } from '../../../components/data-table';
import { capitalise } from '../../../lib/format';
import { PersonActions } from './person-actions';
import { RoleSelect } from './role-select';

export const PEOPLE_SORT_FIELDS = [
  { key: 'name', label: 'Name' },
  { key: 'email', label: 'E-mail' },
  { key: 'role', label: 'Role' },
];

export function PeopleTable({ people, sort, onSort }: { people: UserDto[]; sort?: string; onSort: (sort: string) => void }) {
  const columns: Column<UserDto>[] = [
    { key: 'name', header: 'Name', sortKey: 'name', render: (person) => person.name },
    { key: 'email', header: 'E-mail', sortKey: 'email', render: (person) => <span className="break-all">{person.email}</span> },
    { key: 'role', header: 'Role', sortKey: 'role', render: (person) => (person.abilities.update ? <RoleSelect person={person} /> : capitalise(person.role)) },
    {
      key: 'neighbourhoods',
      header: 'Neighbourhoods',
      align: 'right',
      render: (person) => (person.role === 'operator' ? person.neighbourhoodIds.length : '—'),
    },
    { key: 'active', header: 'Status', render: (person) => (person.erased ? 'Erased' : person.invited ? 'Invited' : person.active ? 'Active' : 'Inactive') },
    { key: 'actions', header: 'Actions', align: 'right', render: (person) => <PersonActions person={person} /> },
  ];
  return <DataTable testId="people-table" caption="People" rows={people} columns={columns} rowKey={(person) => person.id} sort={sort} onSort={onSort} />;
}
