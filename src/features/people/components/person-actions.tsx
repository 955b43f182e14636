import { useState } from 'react';
import type { UserDto } from '../../../../shared/schemas/user';
import { buttonClass, Button } from '../../../components/button';
import { errorMessage } from '../../../lib/api';
import { exportUrl, useErasePerson, useInvite } from '../api/account';
import { useUpdatePerson } from '../api/people';

const errorText = errorMessage;

/** What an admin can do to one person; each button appears only when the server's abilities allow it. */
export function PersonActions({ person }: { person: UserDto }) {
  const update = useUpdatePerson(person.id);
  const erase = useErasePerson(person.id);
  const invite = useInvite();
  const [message, setMessage] = useState<string | null>(null);

  function toggleActive() {
    const verb = person.active ? 'Deactivate' : 'Reactivate';
    if (person.active && !window.confirm(`${verb} ${person.name}? They are signed out at once and cannot sign in until reactivated.`)) return;
    update.mutate(
      { active: !person.active },
      { onSuccess: () => setMessage(null), onError: (e) => setMessage(errorText(e, `Could not ${verb.toLowerCase()}.`)) },
    );
  }

  function confirmErase() {
    const typed = window.prompt(
      `Erase ${person.name}'s personal data? Their name, e-mail, phone and password are removed for good; sites they hosted lose their host; ` +
        `outages and history keep an anonymous "Former member #${person.id}". Type ERASE to confirm.`,
    );
    if (typed !== 'ERASE') return;
    erase.mutate(undefined, { onSuccess: () => setMessage('Erased.'), onError: (e) => setMessage(errorText(e, 'Could not erase.')) });
  }

  return (
    <div className="flex flex-wrap justify-end gap-1.5" data-testid={`person-actions-${person.id}`}>
      {person.abilities.invite && (
        <Button
          onClick={() =>
            invite.mutate(
              { email: person.email, name: person.name, role: person.role },
              { onSuccess: () => setMessage('Invitation sent again.'), onError: (e) => setMessage(errorText(e, 'Could not send.')) },
            )
          }
          disabled={invite.isPending}
        >
          Send invitation again
        </Button>
      )}
      {person.abilities.delete && !person.erased && !person.invited && (
        <Button onClick={toggleActive} disabled={update.isPending}>
          {person.active ? 'Deactivate' : 'Reactivate'}
        </Button>
      )}
      {person.abilities.export && (
        <a className={buttonClass('secondary')} href={exportUrl(person.id)} download={`parapet-person-${person.id}.json`}>
          Export data
        </a>
      )}
      {person.abilities.erase && (
        <Button variant="danger" onClick={confirmErase} disabled={erase.isPending}>
          Erase
        </Button>
      )}
      <p aria-live="polite" className="w-full text-right text-xs text-muted empty:hidden">
        {message ?? ''}
      </p>
    </div>
  );
}
