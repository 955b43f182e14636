import { useState, type FormEvent } from 'react';
import { outageNotesSchema, type OutageDto } from '../../../../shared/schemas/outage';
import { Button } from '../../../components/button';
import { TextAreaField } from '../../../components/form-field';
import { errorMessage } from '../../../lib/api';
import { useUpdateOutageNotes } from '../api/outages';

/** An outage's notes, editable in place by those the server allows to annotate it. */
export function OutageNotes({ outage }: { outage: OutageDto }) {
  const [editing, setEditing] = useState(false);
  const [text, setText] = useState(outage.notes ?? '');
  const [errors, setErrors] = useState<string[]>([]);
  const save = useUpdateOutageNotes(outage.id);

  function submit(event: FormEvent) {
    event.preventDefault();
    const parsed = outageNotesSchema.safeParse({ notes: text });
    if (!parsed.success) {
      setErrors(parsed.error.issues.map((issue) => `Notes ${issue.message}.`));
      return;
    }
    setErrors([]);
    save.mutate(parsed.data.notes, {
      onSuccess: () => setEditing(false),
      onError: (error) => setErrors([errorMessage(error, 'Could not save the notes. Try again.')]),
    });
  }

  if (!editing) {
    return (
      <div className="min-w-0 text-left">
        {outage.notes ? <p className="whitespace-pre-line break-words">{outage.notes}</p> : <p className="text-muted">—</p>}
        {outage.abilities.annotate && (
          <button
            type="button"
            className="mt-0.5 text-xs font-medium text-accent hover:underline"
            onClick={() => {
              setText(outage.notes ?? '');
              setEditing(true);
            }}
          >
            {outage.notes ? 'Edit notes' : 'Add notes'}
            <span className="sr-only"> for the outage of {outage.nodeName}</span>
          </button>
        )}
      </div>
    );
  }

  return (
    <form onSubmit={submit} className="w-full min-w-56 space-y-2 text-left" data-testid={`notes-form-${outage.id}`}>
      <TextAreaField
        label={`Notes on the outage of ${outage.nodeName}`}
        value={text}
        onChange={(event) => setText(event.target.value)}
        errors={errors}
        maxLength={4000}
        autoFocus
      />
      <div className="flex gap-2">
        <Button type="submit" variant="primary" disabled={save.isPending}>
          {save.isPending ? 'Saving…' : 'Save notes'}
        </Button>
        <Button onClick={() => setEditing(false)} disabled={save.isPending}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
