import { useState, type ReactNode } from 'react';
import type { LinkDto } from '../../../../shared/schemas/link';
import { Button } from '../../../components/button';
import { FormMessage } from '../../../components/form-field';
import { errorMessage } from '../../../lib/api';
import { ALL_ROWS } from '../../../lib/resource';
import { useDeleteLink, useLinks } from '../api/links';
import { LinkForm } from './link-form';

type Editing = { kind: 'none' } | { kind: 'new' } | { kind: 'edit'; link: LinkDto };
const linkName = (link: LinkDto) => link.name ?? `link #${link.id}`;

function RemoveLink({ link, onError }: { link: LinkDto; onError: (message: string | null) => void }) {
  const remove = useDeleteLink(link.id);
  return (
    <Button
      variant="danger"
      className="px-2 py-0.5 text-xs"
      disabled={remove.isPending}
      aria-label={`Remove ${linkName(link)}`}
      onClick={() => {
        if (!window.confirm(`Remove ${linkName(link)}? Its radios stay; only the link between them goes.`)) return;
        onError(null);
        remove.mutate(undefined, { onError: (e) => onError(errorMessage(e, 'Could not remove the link. Try again.')) });
      }}
    >
      Remove
    </Button>
  );
}

interface LinkEditorProps {
  nodeId: number;
  /** Whether the caller manages this node (from the server's abilities), so may add links from it. */
  canManage: boolean;
  /** Draws the node's links; `actionsFor(linkId)` gives the edit and remove buttons the caller may use. */
  children: (actionsFor: (linkId: number) => ReactNode) => ReactNode;
}

/** Adding, editing and removing the links of one node, around whatever list the page draws them in. */
export function LinkEditor({ nodeId, canManage, children }: LinkEditorProps) {
  const links = useLinks({ nodeId, ...ALL_ROWS });
  const [editing, setEditing] = useState<Editing>({ kind: 'none' });
  const [removeError, setRemoveError] = useState<string | null>(null);
  const close = () => setEditing({ kind: 'none' });
  const byId = new Map((links.data?.data ?? []).map((l) => [l.id, l]));

  const actionsFor = (linkId: number) => {
    const link = byId.get(linkId);
    if (!link || !(link.abilities.update || link.abilities.delete)) return null;
    return (
      <span className="inline-flex gap-1.5">
        {link.abilities.update && (
          <Button className="px-2 py-0.5 text-xs" aria-label={`Edit ${linkName(link)}`} onClick={() => setEditing({ kind: 'edit', link })}>
            Edit
          </Button>
        )}
        {link.abilities.delete && <RemoveLink link={link} onError={setRemoveError} />}
      </span>
    );
  };

  return (
    <div className="space-y-3">
      {canManage && editing.kind === 'none' && <Button onClick={() => setEditing({ kind: 'new' })}>Add a link</Button>}
      {editing.kind !== 'none' && (
        <LinkForm
          key={editing.kind === 'edit' ? editing.link.id : 'new'}
          nodeId={nodeId}
          link={editing.kind === 'edit' ? editing.link : undefined}
          onSaved={close}
          onCancel={close}
        />
      )}
      <FormMessage message={removeError} />
      {children(actionsFor)}
    </div>
  );
}
