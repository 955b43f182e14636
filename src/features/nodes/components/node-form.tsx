import { nodeCreateSchema, nodeUpdateSchema, type NodeDto } from '../../../../shared/schemas/node';
import { CheckboxField, FormMessage, SelectField, TextField, type Option, FormActions } from '../../../components/form-field';
import { optionalText, toNumber, useForm } from '../../../lib/form';
import { useCreateNode, useUpdateNode } from '../api/nodes';

interface NodeFormProps {
  node?: NodeDto;
  siteOptions: Option[];
  neighbourhoodOptions: Option[];
  onSaved: (node: NodeDto) => void;
  onCancel: () => void;
}

function initialValues(node?: NodeDto) {
  return {
    name: node?.name ?? '',
    siteId: node ? String(node.siteId) : '',
    neighbourhoodId: node ? String(node.neighbourhoodId) : '',
    hardware: node?.hardware ?? '',
    firmware: node?.firmware ?? '',
    managementAddress: node?.managementAddress ?? '',
    reportIntervalS: node ? String(node.reportIntervalS) : '60',
    isUplink: node?.isUplink ?? false,
  };
}

export function NodeForm({ node, siteOptions, neighbourhoodOptions, onSaved, onCancel }: NodeFormProps) {
  const form = useForm(initialValues(node));
  const create = useCreateNode();
  const update = useUpdateNode(node?.id ?? 0);
  const saving = create.isPending || update.isPending;
  const { values, errors, set } = form;

  function submit() {
    const input = {
      name: values.name,
      siteId: toNumber(values.siteId),
      // Blank leaves the neighbourhood to follow the site's.
      neighbourhoodId: toNumber(values.neighbourhoodId),
      hardware: optionalText(values.hardware),
      firmware: optionalText(values.firmware),
      managementAddress: values.managementAddress.trim() === '' ? null : values.managementAddress,
      reportIntervalS: toNumber(values.reportIntervalS),
      isUplink: values.isUplink,
    };
    if (node) {
      const parsed = form.check(nodeUpdateSchema, input);
      if (parsed) update.mutate(parsed, { onSuccess: onSaved, onError: form.showServerError });
    } else {
      const parsed = form.check(nodeCreateSchema, input);
      if (parsed) create.mutate(parsed, { onSuccess: onSaved, onError: form.showServerError });
    }
  }

  return (
    <form
      noValidate
      aria-label={node ? `Edit ${node.name}` : 'New node'}
      className="space-y-4 rounded-lg border border-line bg-surface p-4"
      onSubmit={(event) => {
        event.preventDefault();
        submit();
      }}
    >
      <FormMessage message={form.formError} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Name" value={values.name} onChange={(e) => set('name', e.target.value)} errors={errors.name} />
        <SelectField label="Site" value={values.siteId} onChange={(e) => set('siteId', e.target.value)} options={siteOptions} placeholder="Choose…" errors={errors.siteId} />
        <SelectField
          label="Neighbourhood"
          value={values.neighbourhoodId}
          onChange={(e) => set('neighbourhoodId', e.target.value)}
          options={neighbourhoodOptions}
          placeholder="Same as the site"
          errors={errors.neighbourhoodId}
        />
        <TextField label="Report interval (s)" inputMode="numeric" value={values.reportIntervalS} onChange={(e) => set('reportIntervalS', e.target.value)} errors={errors.reportIntervalS} hint="How often the node sends a heartbeat, 10–3600 s" />
        <TextField label="Hardware" value={values.hardware} onChange={(e) => set('hardware', e.target.value)} errors={errors.hardware} />
        <TextField label="Firmware" value={values.firmware} onChange={(e) => set('firmware', e.target.value)} errors={errors.firmware} />
        <TextField label="Management address" inputMode="decimal" value={values.managementAddress} onChange={(e) => set('managementAddress', e.target.value)} errors={errors.managementAddress} hint="IPv4, e.g. 10.20.1.1" />
        <div className="self-center">
          <CheckboxField label="Uplink node (carries the shared internet connection)" checked={values.isUplink} onChange={(e) => set('isUplink', e.target.checked)} errors={errors.isUplink} />
        </div>
      </div>
      <FormActions label={node ? 'Save changes' : 'Add node'} busy={saving} onCancel={onCancel} />
    </form>
  );
}
