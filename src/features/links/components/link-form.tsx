import { useState } from 'react';
import { Link } from 'react-router-dom';
import { LINK_STATUSES } from '../../../../shared/enums';
import { linkCreateSchema, linkUpdateSchema, type LinkDto } from '../../../../shared/schemas/link';
import type { RadioDto } from '../../../../shared/schemas/radio';
import { Button } from '../../../components/button';
import { FormMessage, SelectField, TextField, type Option, FormActions } from '../../../components/form-field';
import { optionalText, toNumber, useForm } from '../../../lib/form';
import { useNodeChoices, useRadioChoices, useSiteChoices } from '../../../lib/inventory-choices';
import { paths } from '../../../lib/paths';
import { useCreateLink, useUpdateLink } from '../api/links';

const STATUS_OPTIONS: Option[] = LINK_STATUSES.map((s) => ({ value: s, label: s === 'live' ? 'Live (installed and carrying traffic)' : 'Planned (not installed yet)' }));
const radioLabel = (r: RadioDto) => `${r.iface} · ${r.band} GHz ch ${r.channel} (${r.channelWidthMHz} MHz)${r.ssid ? ` · ${r.ssid}` : ''}`;
const radioOptions = (rows: RadioDto[] | undefined): Option[] => (rows ?? []).map((r) => ({ value: String(r.id), label: radioLabel(r) }));

interface LinkFormProps {
  /** The node whose page (or map panel) this is: its radio is end A of a new link. */
  nodeId: number;
  link?: LinkDto;
  onSaved: (link: LinkDto) => void;
  onCancel: () => void;
}

/** Add a link from one of this node's radios to a radio of another node (picked by site, then node), or edit one. */
export function LinkForm({ nodeId, link, onSaved, onCancel }: LinkFormProps) {
  return link ? <EditLink link={link} onSaved={onSaved} onCancel={onCancel} /> : <NewLink nodeId={nodeId} onSaved={onSaved} onCancel={onCancel} />;
}

function FormFrame({ label, onSubmit, children }: { label: string; onSubmit: () => void; children: React.ReactNode }) {
  return (
    <form
      noValidate
      aria-label={label}
      data-testid="link-form"
      className="@container space-y-4 rounded-lg border border-line bg-surface p-4"
      onSubmit={(event) => {
        event.preventDefault();
        onSubmit();
      }}
    >
      {children}
    </form>
  );
}

function NewLink({ nodeId, onSaved, onCancel }: Omit<LinkFormProps, 'link'>) {
  const form = useForm({ radioAId: '', radioBId: '', name: '', status: 'planned' });
  const [farSiteId, setFarSiteId] = useState('');
  const [farNodeId, setFarNodeId] = useState('');
  const create = useCreateLink();
  const nearRadios = useRadioChoices(nodeId);
  const sites = useSiteChoices();
  const farNodes = useNodeChoices(farSiteId ? Number(farSiteId) : undefined);
  const farRadios = useRadioChoices(farNodeId ? Number(farNodeId) : null);
  const { values, errors, set } = form;

  const nodeOptions: Option[] = farSiteId
    ? (farNodes.data ?? []).filter((n) => n.id !== nodeId).map((n) => ({ value: String(n.id), label: n.name }))
    : [];

  function submit() {
    const input = { radioAId: toNumber(values.radioAId), radioBId: toNumber(values.radioBId), name: optionalText(values.name), status: values.status };
    const parsed = form.check(linkCreateSchema, input);
    if (parsed) create.mutate(parsed, { onSuccess: onSaved, onError: form.showServerError });
  }

  if (nearRadios.isSuccess && nearRadios.data.length === 0) {
    return (
      <div className="rounded-lg border border-line bg-surface p-4 text-sm">
        <p>This node has no radios yet. Add the radio that carries the link first, then link it to the far end.</p>
        <Button className="mt-3" onClick={onCancel}>
          Close
        </Button>
      </div>
    );
  }

  return (
    <FormFrame label="New link" onSubmit={submit}>
      <FormMessage message={form.formError} />
      <div className="grid gap-4 @md:grid-cols-2">
        <SelectField label="This node's radio" value={values.radioAId} onChange={(e) => set('radioAId', e.target.value)} options={radioOptions(nearRadios.data)} placeholder="Choose…" errors={errors.radioAId} />
        <SelectField
          label="Far end: site"
          value={farSiteId}
          onChange={(e) => {
            setFarSiteId(e.target.value);
            setFarNodeId('');
            set('radioBId', '');
          }}
          options={(sites.data ?? []).map((s) => ({ value: String(s.id), label: s.name }))}
          placeholder="Choose the far end's site…"
        />
        <SelectField
          label="Far end: node"
          value={farNodeId}
          disabled={!farSiteId}
          onChange={(e) => {
            setFarNodeId(e.target.value);
            set('radioBId', '');
          }}
          options={nodeOptions}
          placeholder={farSiteId && farNodes.isSuccess && nodeOptions.length === 0 ? 'No other node at this site' : 'Choose…'}
        />
        <SelectField
          label="Far end: radio"
          value={values.radioBId}
          disabled={!farNodeId}
          onChange={(e) => set('radioBId', e.target.value)}
          options={radioOptions(farRadios.data)}
          placeholder={farNodeId && farRadios.isSuccess && farRadios.data.length === 0 ? 'That node has no radios yet' : 'Choose…'}
          errors={errors.radioBId}
          hint={
            farNodeId && farRadios.isSuccess && farRadios.data.length === 0 ? (
              <>
                Add its radio on <Link to={paths.nodeDetail.to(Number(farNodeId))} className="text-accent hover:underline">the far node's page</Link> first.
              </>
            ) : undefined
          }
        />
        <TextField label="Name (optional)" value={values.name} onChange={(e) => set('name', e.target.value)} errors={errors.name} hint="e.g. Granary to Mill backhaul" />
        <SelectField label="Status" value={values.status} onChange={(e) => set('status', e.target.value)} options={STATUS_OPTIONS} errors={errors.status} />
      </div>
      <FormActions label="Add link" busy={create.isPending} onCancel={onCancel} />
    </FormFrame>
  );
}

function EditLink({ link, onSaved, onCancel }: { link: LinkDto; onSaved: (link: LinkDto) => void; onCancel: () => void }) {
  const form = useForm({ name: link.name ?? '', status: link.status as string });
  const update = useUpdateLink(link.id);
  const { values, errors, set } = form;

  function submit() {
    const parsed = form.check(linkUpdateSchema, { name: optionalText(values.name), status: values.status });
    if (parsed) update.mutate(parsed, { onSuccess: onSaved, onError: form.showServerError });
  }

  return (
    <FormFrame label={`Edit ${link.name ?? `link #${link.id}`}`} onSubmit={submit}>
      <FormMessage message={form.formError} />
      <p className="text-sm text-muted">A link always joins the same two radios; to join others, remove it and add a new one.</p>
      <div className="grid gap-4 @md:grid-cols-2">
        <TextField label="Name (optional)" value={values.name} onChange={(e) => set('name', e.target.value)} errors={errors.name} />
        <SelectField label="Status" value={values.status} onChange={(e) => set('status', e.target.value)} options={STATUS_OPTIONS} errors={errors.status} />
      </div>
      <FormActions label="Save link" busy={update.isPending} onCancel={onCancel} />
    </FormFrame>
  );
}
