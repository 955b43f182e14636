import { useId, useState } from 'react';
import { ROLES, type Role } from '../../../../shared/enums';
import type { UserDto } from '../../../../shared/schemas/user';
import { errorMessage } from '../../../lib/api';
import { capitalise } from '../../../lib/format';
import { lazySchema } from '../../../lib/schema-issues';
import { useUpdatePerson } from '../api/people';

// Its module also holds the password rules and their dictionary: fetched on the first change, not with the page.
const loadSchema = lazySchema(() => import('../../../../shared/schemas/user').then((m) => m.userUpdateSchema));

/** Change one person's role in place; the server decides whether this caller may. */
export function RoleSelect({ person }: { person: UserDto }) {
  const id = useId();
  const update = useUpdatePerson(person.id);
  const [message, setMessage] = useState<string | null>(null);

  async function change(role: string) {
    let schema;
    try {
      schema = await loadSchema();
    } catch {
      setMessage('Could not load the role check. Check your connection and try again.');
      return;
    }
    const parsed = schema.safeParse({ role });
    if (!parsed.success) {
      setMessage(parsed.error.issues.map((issue) => issue.message).join(' '));
      return;
    }
    setMessage(null);
    update.mutate(parsed.data, {
      onError: (error) => setMessage(errorMessage(error, 'Could not change the role. Try again.')),
    });
  }

  return (
    <div className="inline-flex flex-col items-end gap-1 sm:items-start">
      <label htmlFor={id} className="sr-only">
        Role of {person.name}
      </label>
      <select
        id={id}
        value={update.isPending && update.variables?.role ? update.variables.role : person.role}
        disabled={update.isPending}
        onChange={(event) => void change(event.target.value)}
        aria-describedby={`${id}-error`}
        className="rounded-md border border-line-strong bg-surface px-2 py-1 text-sm"
      >
        {ROLES.map((role: Role) => (
          <option key={role} value={role}>
            {capitalise(role)}
          </option>
        ))}
      </select>
      <p id={`${id}-error`} aria-live="polite" className="text-xs text-danger empty:hidden">
        {message ?? ''}
      </p>
    </div>
  );
}
