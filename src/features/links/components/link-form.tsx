import { useState } from 'react';
import { Link } from 'react-router-dom';
import { LINK_STATUSES } from '../../../../shared/enums';
import { linkCreateSchema, linkUpdateSchema, type LinkDto } from '../../../../shared/schemas/link';
import type { RadioDto } from '../../../../shared/schemas/radio';
import { Button } from '../../../components/button';
import { FormMessage, SelectField, TextField, type Option, FormActions } from '../../../components/form-field';
import { optionalText, toNumber, useSchemaForm } from '../../../lib/schema-form';
import { useNodeChoices, useRadioChoices, useSiteChoices } from '../../../lib/inventory-choices';
import { paths } from '../../../lib/paths';
import { useCreateLink, useUpdateLink } from '../api/links';

const STATUS_OPTIONS: Option[] = LINK_STATUSES.map((s) => ({
  value: s,
  label: s === 'live' ? 'Live (installed and carrying traffic)' : 'Planned (not installed yet)',
}));
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

function FormFrame({ label, onSubmit, children }: { label: string; onSubmit: (event: React.FormEvent) => void; children: React.ReactNode }) {
  return (
    <form
      noValidate
      aria-label={label}
      data-testid="link-form"
      className="@container space-y-4 rounded-lg border border-line bg-surface p-4"
      onSubmit={onSubmit}
    >
      {children}
    </form>
  );
}

function NewLink({ nodeId, onSaved, onCancel }: Omit<LinkFormProps, 'link'>) {
  const form = useSchemaForm({
    defaultValues: { radioAId: '', radioBId: '', name: '', status: 'planned' },
    schema: linkCreateSchema,
    toInput: (values) => ({ radioAId: toNumber(values.radioAId), radioBId: toNumber(values.radioBId), name: optionalText(values.name), status: values.status }),
  });
  const [farSiteId, setFarSiteId] = useState('');
  const [farNodeId, setFarNodeId] = useState('');
  const create = useCreateLink();
  const nearRadios = useRadioChoices(nodeId);
  const sites = useSiteChoices();
  const farNodes = useNodeChoices(farSiteId ? Number(farSiteId) : undefined);
  const farRadios = useRadioChoices(farNodeId ? Number(farNodeId) : null);
  const { field, setValue } = form;

  const nodeOptions: Option[] = farSiteId ? (farNodes.data ?? []).filter((n) => n.id !== nodeId).map((n) => ({ value: String(n.id), label: n.name })) : [];

  const submit = form.handleSubmit((input) => create.mutate(input, { onSuccess: onSaved, onError: form.showServerError }));

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
        <SelectField label="This node's radio" {...field('radioAId')} options={radioOptions(nearRadios.data)} placeholder="Choose…" />
        <SelectField
          label="Far end: site"
          value={farSiteId}
          onChange={(e) => {
            setFarSiteId(e.target.value);
            setFarNodeId('');
            setValue('radioBId', '');
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
            setValue('radioBId', '');
          }}
          options={nodeOptions}
          placeholder={farSiteId && farNodes.isSuccess && nodeOptions.length === 0 ? 'No other node at this site' : 'Choose…'}
        />
        <SelectField
          label="Far end: radio"
          {...field('radioBId')}
          disabled={!farNodeId}
          options={radioOptions(farRadios.data)}
          placeholder={farNodeId && farRadios.isSuccess && farRadios.data.length === 0 ? 'That node has no radios yet' : 'Choose…'}
          hint={
            farNodeId && farRadios.isSuccess && farRadios.data.length === 0 ? (
              <>
                Add its radio on{' '}
                <Link to={paths.nodeDetail.to(Number(farNodeId))} className="text-accent hover:underline">
                  the far node's page
                </Link>{' '}
                first.
              </>
            ) : undefined
          }
        />
        <TextField label="Name (optional)" {...field('name')} hint="e.g. Granary to Mill backhaul" />
        <SelectField label="Status" {...field('status')} options={STATUS_OPTIONS} />
      </div>
      <FormActions label="Add link" busy={create.isPending} onCancel={onCancel} />
    </FormFrame>
  );
}

function EditLink({ link, onSaved, onCancel }: { link: LinkDto; onSaved: (link: LinkDto) => void; onCancel: () => void }) {
  const form = useSchemaForm({
    defaultValues: { name: link.name ?? '', status: link.status as string },
    schema: linkUpdateSchema,
    toInput: (values) => ({ name: optionalText(values.name), status: values.status }),
  });
  const update = useUpdateLink(link.id);
  const submit = form.handleSubmit((input) => update.mutate(input, { onSuccess: onSaved, onError: form.showServerError }));

  return (
    <FormFrame label={`Edit ${link.name ?? `link #${link.id}`}`} onSubmit={submit}>
      <FormMessage message={form.formError} />
      <p className="text-sm text-muted">A link always joins the same two radios; to join others, remove it and add a new one.</p>
      <div className="grid gap-4 @md:grid-cols-2">
        <TextField label="Name (optional)" {...form.field('name')} />
        <SelectField label="Status" {...form.field('status')} options={STATUS_OPTIONS} />
      </div>
      <FormActions label="Save link" busy={update.isPending} onCancel={onCancel} />
    </FormFrame>
  );
}
