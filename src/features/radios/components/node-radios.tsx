import { useState } from 'react';
import type { ChannelRegion } from '../../../../shared/radio/channels';
import type { RadioDto } from '../../../../shared/schemas/radio';
import { Button } from '../../../components/button';
import { EmptyState } from '../../../components/empty-state';
import { FormMessage } from '../../../components/form-field';
import { LoadError, Loading } from '../../../components/query-state';
import { errorMessage } from '../../../lib/api';
import { ALL_ROWS } from '../../../lib/resource';
import { useDeleteRadio, useRadios } from '../api/radios';
import { RadioForm } from './radio-form';
import { RadiosTable } from './radios-table';

type Editing = { kind: 'none' } | { kind: 'new' } | { kind: 'edit'; radio: RadioDto };

function RemoveRadio({ radio, onError }: { radio: RadioDto; onError: (message: string | null) => void }) {
  const remove = useDeleteRadio(radio.id);
  return (
    <Button
      variant="danger"
      className="px-2 py-0.5 text-xs"
      disabled={remove.isPending}
      aria-label={`Remove radio ${radio.iface}`}
      onClick={() => {
        if (!window.confirm(`Remove the radio ${radio.iface} and every link it carries? This cannot be undone.`)) return;
        onError(null);
        remove.mutate(undefined, { onError: (e) => onError(errorMessage(e, 'Could not remove the radio. Try again.')) });
      }}
    >
      Remove
    </Button>
  );
}

/** A node's radios: the table, and for those who manage the node, adding, editing and removing them. */
export function NodeRadios({ nodeId, canManage, region }: { nodeId: number; canManage: boolean; region: ChannelRegion | undefined }) {
  const radios = useRadios({ nodeId, ...ALL_ROWS });
  const [editing, setEditing] = useState<Editing>({ kind: 'none' });
  const [removeError, setRemoveError] = useState<string | null>(null);
  const close = () => setEditing({ kind: 'none' });
  const editable = canManage && region !== undefined;

  return (
    <div className="space-y-3">
      {editable && editing.kind === 'none' && (
        <Button variant="primary" onClick={() => setEditing({ kind: 'new' })}>
          Add a radio
        </Button>
      )}
      {editable && editing.kind !== 'none' && (
        <RadioForm
          key={editing.kind === 'edit' ? editing.radio.id : 'new'}
          nodeId={nodeId}
          region={region}
          radio={editing.kind === 'edit' ? editing.radio : undefined}
          onSaved={close}
          onCancel={close}
        />
      )}
      <FormMessage message={removeError} />
      {radios.isPending ? (
        <Loading label="Loading radios…" />
      ) : radios.isError ? (
        <LoadError error={radios.error} />
      ) : radios.data.data.length === 0 ? (
        <EmptyState title="No radios recorded for this node">
          {canManage ? 'Add each radio the router carries, with its channel and power.' : undefined}
        </EmptyState>
      ) : (
        <RadiosTable
          radios={radios.data.data}
          actions={
            canManage
              ? (radio) => (
                  <span className="inline-flex gap-1.5">
                    {radio.abilities.update && (
                      <Button className="px-2 py-0.5 text-xs" aria-label={`Edit radio ${radio.iface}`} onClick={() => setEditing({ kind: 'edit', radio })}>
                        Edit
                      </Button>
                    )}
                    {radio.abilities.delete && <RemoveRadio radio={radio} onError={setRemoveError} />}
                  </span>
                )
              : undefined
          }
        />
      )}
    </div>
  );
}
