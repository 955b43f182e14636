import { nodeCreateSchema, nodeUpdateSchema, type NodeCreate, type NodeDto } from '../../../../shared/schemas/node';
import { CheckboxField, FormMessage, SelectField, TextField, type Option, FormActions } from '../../../components/form-field';
import { optionalText, toNumber, useSchemaForm } from '../../../lib/schema-form';
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
  const create = useCreateNode();
  const update = useUpdateNode(node?.id ?? 0);
  const form = useSchemaForm({
    defaultValues: initialValues(node),
    schema: node ? nodeUpdateSchema : nodeCreateSchema,
    toInput: (values) => ({
      name: values.name,
      siteId: toNumber(values.siteId),
      // Blank leaves the neighbourhood to follow the site's.
      neighbourhoodId: toNumber(values.neighbourhoodId),
      hardware: optionalText(values.hardware),
      firmware: optionalText(values.firmware),
      managementAddress: values.managementAddress.trim() === '' ? null : values.managementAddress,
      reportIntervalS: toNumber(values.reportIntervalS),
      isUplink: values.isUplink,
    }),
  });
  const { field } = form;
  const submit = form.handleSubmit((input) => {
    if (node) update.mutate(input, { onSuccess: onSaved, onError: form.showServerError });
    else create.mutate(input as NodeCreate, { onSuccess: onSaved, onError: form.showServerError });
  });

  return (
    <form noValidate aria-label={node ? `Edit ${node.name}` : 'New node'} className="space-y-4 rounded-lg border border-line bg-surface p-4" onSubmit={submit}>
      <FormMessage message={form.formError} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Name" {...field('name')} />
        <SelectField label="Site" {...field('siteId')} options={siteOptions} placeholder="Choose…" />
        <SelectField label="Neighbourhood" {...field('neighbourhoodId')} options={neighbourhoodOptions} placeholder="Same as the site" />
        <TextField label="Report interval (s)" inputMode="numeric" {...field('reportIntervalS')} hint="How often the node sends a heartbeat, 10–3600 s" />
        <TextField label="Hardware" {...field('hardware')} />
        <TextField label="Firmware" {...field('firmware')} />
        <TextField label="Management address" inputMode="decimal" {...field('managementAddress')} hint="IPv4, e.g. 10.20.1.1" />
        <div className="self-center">
          <CheckboxField label="Uplink node (carries the shared internet connection)" {...field('isUplink')} />
        </div>
      </div>
      <FormActions label={node ? 'Save changes' : 'Add node'} busy={create.isPending || update.isPending} onCancel={onCancel} />
    </form>
  );
}
