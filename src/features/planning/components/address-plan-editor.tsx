import { useState, type FormEvent } from 'react';
import { nodeAddressPlanSchema } from '../../../../shared/schemas/planningRecords';
import { FormMessage, TextField, FormActions } from '../../../components/form-field';
import { errorMessage } from '../../../lib/api';
import { useSaveAddressPlan } from '../api/planning';
import type { AddressPlanRow } from '../api/types';

/** Edits one node's subnet, gateway, DHCP range and static addresses; validated by the same schema as the server. */
export function AddressPlanEditor({ plan, onDone }: { plan: AddressPlanRow; onDone: () => void }) {
  const save = useSaveAddressPlan();
  const [v, setV] = useState({
    cidr: plan.cidr,
    gateway: plan.gateway,
    dhcpStart: plan.dhcpStart ?? '',
    dhcpEnd: plan.dhcpEnd ?? '',
    staticAddresses: plan.staticAddresses.join(', '),
  });
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<string | null>(null);

  function submit(e: FormEvent) {
    e.preventDefault();
    const body = {
      cidr: v.cidr.trim(),
      gateway: v.gateway.trim(),
      dhcpStart: v.dhcpStart.trim() || null,
      dhcpEnd: v.dhcpEnd.trim() || null,
      staticAddresses: v.staticAddresses.split(/[\s,]+/).filter(Boolean),
    };
    const parsed = nodeAddressPlanSchema.safeParse(body);
    if (!parsed.success) {
      setErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0]), [i.message]])));
      return;
    }
    setErrors({});
    save.mutate({ nodeId: plan.nodeId, ...parsed.data }, { onSuccess: onDone, onError: (err) => setMessage(errorMessage(err, 'Could not save. Try again.')) });
  }
  const field = (key: keyof typeof v, label: string, hint?: string) => (
    <TextField label={label} value={v[key]} errors={errors[key]} hint={hint} onChange={(e) => setV({ ...v, [key]: e.target.value })} />
  );
  return (
    <form onSubmit={submit} className="space-y-3 rounded-lg border border-accent/50 bg-surface p-4" data-testid="address-plan-editor">
      <p className="text-sm font-semibold">Addresses of {plan.nodeName}</p>
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
        {field('cidr', 'Subnet (CIDR)')}
        {field('gateway', 'Gateway')}
        {field('dhcpStart', 'DHCP range start')}
        {field('dhcpEnd', 'DHCP range end')}
        {field('staticAddresses', 'Static addresses', 'Separated by commas.')}
      </div>
      <FormMessage message={message} />
      <FormActions label="Save" busy={save.isPending} onCancel={onDone} />
    </form>
  );
}
