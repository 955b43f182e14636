import { useState } from 'react';
import { operatorAssignmentSchema, type NeighbourhoodDto } from '../../../../shared/schemas/neighbourhood';
import { Button } from '../../../components/button';
import { FormMessage } from '../../../components/form-field';
import { errorMessage } from '../../../lib/api';
import { useAssignOperators } from '../api/neighbourhoods';

interface OperatorAssignmentProps {
  neighbourhood: NeighbourhoodDto;
  /** Everyone with the operator role, from the people list. */
  operators: { id: number; name: string; email: string }[];
}

/** Tick who is on the rota for this neighbourhood, then save the whole set at once. */
export function OperatorAssignment({ neighbourhood, operators }: OperatorAssignmentProps) {
  const [chosen, setChosen] = useState<Set<number>>(() => new Set(neighbourhood.operatorIds));
  const [message, setMessage] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);
  const assign = useAssignOperators(neighbourhood.id);

  function toggle(id: number) {
    setSaved(false);
    setChosen((current) => {
      const next = new Set(current);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });
  }

  function save() {
    const parsed = operatorAssignmentSchema.safeParse({ userIds: [...chosen] });
    if (!parsed.success) {
      setMessage(parsed.error.issues.map((issue) => issue.message).join(' '));
      return;
    }
    setMessage(null);
    assign.mutate(parsed.data.userIds, {
      onSuccess: () => setSaved(true),
      onError: (error) => setMessage(errorMessage(error, 'Could not save. Try again.')),
    });
  }

  if (operators.length === 0) {
    return <p className="text-sm text-muted">No one has the operator role yet. Give someone that role on the People page first.</p>;
  }

  return (
    <form
      aria-label="Assign operators"
      className="space-y-3 rounded-lg border border-line bg-surface p-4"
      onSubmit={(event) => {
        event.preventDefault();
        save();
      }}
    >
      <FormMessage message={message} />
      <fieldset>
        <legend className="mb-2 text-sm font-medium">Operators on the rota for {neighbourhood.name}</legend>
        <ul className="grid gap-2 sm:grid-cols-2">
          {operators.map((person) => (
            <li key={person.id}>
              <label className="flex items-center gap-2 text-sm">
                <input type="checkbox" className="h-4 w-4 accent-accent" checked={chosen.has(person.id)} onChange={() => toggle(person.id)} />
                <span>
                  {person.name} <span className="text-muted">{person.email}</span>
                </span>
              </label>
            </li>
          ))}
        </ul>
      </fieldset>
      <div className="flex items-center gap-3">
        <Button type="submit" variant="primary" disabled={assign.isPending}>
          {assign.isPending ? 'Saving…' : 'Save operators'}
        </Button>
        <p aria-live="polite" className="text-sm text-muted">
          {saved ? 'Saved.' : ''}
        </p>
      </div>
    </form>
  );
}
