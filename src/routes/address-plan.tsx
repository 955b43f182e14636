import { useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../components/button';
import { FormMessage, SelectField, TextField } from '../components/form-field';
import { PageHeader, Section } from '../components/page-header';
import { LoadError, Loading } from '../components/query-state';
import { useAddressPlans, useAllocateAddresses, useDeleteAddressPlan, useNetworkSettings, useUpdateNetworkSettings } from '../features/planning/api/planning';
import type { AddressPlanRow } from '../features/planning/api/types';
import { AddressPlanEditor } from '../features/planning/components/address-plan-editor';
import { errorMessage } from '../lib/api';
import { paths } from '../lib/paths';
import { PlanningCaution } from '../features/planning/components/planning-caution';

const say = (e: unknown) => errorMessage(e);

function PoolForm({ pool }: { pool: string | null }) {
  const settings = useNetworkSettings();
  const update = useUpdateNetworkSettings();
  const [value, setValue] = useState(pool ?? '');
  if (!settings.data?.abilities.update)
    return (
      <p className="text-sm">
        Address pool: <strong>{pool ?? 'not set — ask an admin'}</strong>
      </p>
    );
  const submit = (e: FormEvent) => {
    e.preventDefault();
    update.mutate({ addressPool: value.trim() || null });
  };
  return (
    <form onSubmit={submit} className="flex flex-wrap items-end gap-3" data-testid="pool-form">
      <div className="w-64">
        <TextField
          label="Network address pool (admin)"
          value={value}
          onChange={(e) => setValue(e.target.value)}
          hint="A private block such as 10.64.0.0/16 (RFC 1918)."
        />
      </div>
      <Button type="submit" variant="primary" disabled={update.isPending}>
        Save pool
      </Button>
      {update.isError && <FormMessage message={say(update.error)} />}
    </form>
  );
}

export function AddressPlanPage() {
  const plans = useAddressPlans();
  const allocate = useAllocateAddresses();
  const remove = useDeleteAddressPlan();
  const [selected, setSelected] = useState<number[]>([]);
  const [prefix, setPrefix] = useState('24');
  const [editing, setEditing] = useState<AddressPlanRow | null>(null);
  if (plans.isPending) return <Loading />;
  if (plans.isError) return <LoadError error={plans.error} />;
  const d = plans.data;
  const allocatable = d.unplannedNodes.filter((n) => n.abilities.allocate);

  return (
    <>
      <PageHeader title="Address plan" subtitle="A subnet and DHCP range per node, out of the network’s pool." />
      <PoolForm key={d.pool ?? ''} pool={d.pool} />

      <Section title={`Checks (${d.findings.length})`}>
        {d.findings.length === 0 ? (
          <p className="text-sm" data-testid="address-findings">
            ● No overlaps, stray gateways or DHCP clashes.
          </p>
        ) : (
          <ul className="space-y-1 text-sm" data-testid="address-findings">
            {d.findings.map((f) => (
              <li key={`${f.code}-${f.message}`} className="rounded-md border-l-4 border-danger bg-surface px-3 py-1.5">
                <span aria-hidden="true">■ </span>
                {f.message}
              </li>
            ))}
          </ul>
        )}
      </Section>

      <Section title="Subnets">
        {editing && (
          <div className="mb-4">
            <AddressPlanEditor key={editing.nodeId} plan={editing} onDone={() => setEditing(null)} />
          </div>
        )}
        <div className="overflow-x-auto rounded-lg border border-line bg-surface">
          <table className="w-full text-sm" data-testid="address-plan-table">
            <thead className="bg-sunken text-left text-xs text-muted uppercase">
              <tr>
                <th className="px-3 py-2">Node</th>
                <th className="px-3 py-2">Subnet</th>
                <th className="px-3 py-2">Gateway</th>
                <th className="px-3 py-2">DHCP range</th>
                <th className="px-3 py-2">Static</th>
                <th className="px-3 py-2">
                  <span className="sr-only">Actions</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {d.plans.length === 0 && (
                <tr>
                  <td colSpan={6} className="px-3 py-4 text-muted">
                    No node has a subnet yet.
                  </td>
                </tr>
              )}
              {d.plans.map((p) => (
                <tr key={p.nodeId} className="border-t border-line">
                  <td className="px-3 py-2">
                    <Link className="underline" to={paths.provisioningSheet.to(p.nodeId)}>
                      {p.nodeName}
                    </Link>
                  </td>
                  <td className="px-3 py-2 font-mono">{p.cidr}</td>
                  <td className="px-3 py-2 font-mono">{p.gateway}</td>
                  <td className="px-3 py-2 font-mono">{p.dhcpStart ? `${p.dhcpStart} – ${p.dhcpEnd}` : '—'}</td>
                  <td className="px-3 py-2 font-mono">{p.staticAddresses.join(', ') || '—'}</td>
                  <td className="px-3 py-2 whitespace-nowrap">
                    {p.abilities.update && (
                      <Button variant="quiet" onClick={() => setEditing(p)}>
                        Edit
                      </Button>
                    )}
                    {p.abilities.delete && (
                      <Button variant="quiet" onClick={() => window.confirm(`Remove the subnet of ${p.nodeName}?`) && remove.mutate(p.nodeId)}>
                        Remove
                      </Button>
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </Section>

      <Section title="Allocate from the pool">
        {allocatable.length === 0 ? (
          <p className="text-sm text-muted">Every node you manage has a subnet.</p>
        ) : (
          <form
            className="space-y-3"
            onSubmit={(e) => {
              e.preventDefault();
              allocate.mutate({ nodeIds: selected, prefixLength: Number(prefix) }, { onSuccess: () => setSelected([]) });
            }}
          >
            <fieldset className="grid gap-1 sm:grid-cols-2 lg:grid-cols-3">
              <legend className="mb-1 text-sm font-medium">Nodes without a subnet</legend>
              {allocatable.map((n) => (
                <label key={n.nodeId} className="flex items-center gap-2 text-sm">
                  <input
                    type="checkbox"
                    checked={selected.includes(n.nodeId)}
                    onChange={(e) => setSelected(e.target.checked ? [...selected, n.nodeId] : selected.filter((x) => x !== n.nodeId))}
                  />
                  {n.nodeName}
                </label>
              ))}
            </fieldset>
            <div className="flex flex-wrap items-end gap-3">
              <div className="w-40">
                <SelectField
                  label="Subnet size"
                  value={prefix}
                  onChange={(e) => setPrefix(e.target.value)}
                  options={[22, 23, 24, 25, 26, 27, 28].map((p) => ({ value: String(p), label: `/${p} (${2 ** (32 - p) - 2} hosts)` }))}
                />
              </div>
              <Button type="submit" variant="primary" disabled={selected.length === 0 || allocate.isPending || !d.pool}>
                Allocate {selected.length || ''}
              </Button>
            </div>
            <p className="text-xs text-muted">
              Each subnet: gateway on the first host, a few hosts after it kept for static addresses (.2–.10 in a /24), DHCP from there to the last host.
            </p>
            {allocate.isError && <FormMessage message={say(allocate.error)} />}
          </form>
        )}
      </Section>
      <PlanningCaution />
    </>
  );
}
