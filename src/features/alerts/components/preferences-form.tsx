import { useState, type FormEvent } from 'react';
import { OPERATOR_MAIL_MODES, preferencesUpdateSchema, type PreferencesDto, type PreferencesUpdate } from '../../../../shared/schemas/alerts';
import { CheckboxField, FormMessage, SelectField, TextField, FormActions } from '../../../components/form-field';
import { useForm } from '../../../lib/form';
import { useUpdatePreferences } from '../api/alerts';

const MODE_LABELS: Record<(typeof OPERATOR_MAIL_MODES)[number], string> = { immediate: 'Right away', hourly: 'One digest an hour', off: 'None' };

const valuesOf = (p: PreferencesDto) => ({
  operatorMode: p.operatorMode as string,
  degradedDigest: p.degradedDigest,
  hostMail: p.hostMail,
  quietStart: p.quietStart ?? '',
  quietEnd: p.quietEnd ?? '',
  adminNodeMail: p.adminNodeMail,
  adminSelfCheck: p.adminSelfCheck,
  upstreamNotices: p.upstreamNotices,
});

/** The mail a person gets, in the groups that apply to them (operator, host of a site, admin). */
export function PreferencesForm({ preferences }: { preferences: PreferencesDto }) {
  const form = useForm(valuesOf(preferences));
  const update = useUpdatePreferences();
  const [saved, setSaved] = useState(false);
  const { applies } = preferences;

  async function submit(event: FormEvent) {
    event.preventDefault();
    setSaved(false);
    const v = form.values;
    const patch: Record<string, unknown> = {};
    if (applies.operator) Object.assign(patch, { operatorMode: v.operatorMode, degradedDigest: v.degradedDigest });
    if (applies.host) Object.assign(patch, { hostMail: v.hostMail, quietStart: v.quietStart || null, quietEnd: v.quietEnd || null });
    if (applies.admin) Object.assign(patch, { adminNodeMail: v.adminNodeMail, adminSelfCheck: v.adminSelfCheck, upstreamNotices: v.upstreamNotices });
    const body = form.check(preferencesUpdateSchema, patch);
    if (!body) return;
    try {
      form.reset(valuesOf(await update.mutateAsync(body as PreferencesUpdate)));
      setSaved(true);
    } catch (error) {
      form.showServerError(error);
    }
  }

  return (
    <form onSubmit={submit} noValidate className="max-w-xl space-y-6" data-testid="preferences-form">
      {preferences.unsubscribedAt && <p className="rounded-md border border-line bg-sunken px-3 py-2 text-sm">You unsubscribed from all Parapet mail. Choosing any mail below turns it back on.</p>}
      {applies.operator && (
        <fieldset className="space-y-3">
          <legend className="text-base font-semibold">Outages in your neighbourhoods</legend>
          <SelectField label="Outage mail" value={form.values.operatorMode} errors={form.errors.operatorMode} onChange={(e) => form.set('operatorMode', e.target.value)} options={OPERATOR_MAIL_MODES.map((m) => ({ value: m, label: MODE_LABELS[m] }))} />
          <CheckboxField label="Daily digest of nodes degraded for hours" checked={form.values.degradedDigest} onChange={(e) => form.set('degradedDigest', e.target.checked)} />
        </fieldset>
      )}
      {applies.host && (
        <fieldset className="space-y-3">
          <legend className="text-base font-semibold">The node you host</legend>
          <CheckboxField label="Tell me when it stops answering and when it is back" checked={form.values.hostMail} onChange={(e) => form.set('hostMail', e.target.checked)} />
          <div className="grid gap-3 sm:grid-cols-2">
            <TextField label="Quiet from" type="time" value={form.values.quietStart} errors={form.errors.quietStart} onChange={(e) => form.set('quietStart', e.target.value)} />
            <TextField label="Quiet until" type="time" value={form.values.quietEnd} errors={form.errors.quietEnd} onChange={(e) => form.set('quietEnd', e.target.value)} hint={`In the network's time zone (${preferences.timeZone}); mail waits until quiet hours end.`} />
          </div>
        </fieldset>
      )}
      {applies.admin && (
        <fieldset className="space-y-3">
          <legend className="text-base font-semibold">Admin mail</legend>
          <CheckboxField label="Outage mail for every node" checked={form.values.adminNodeMail} onChange={(e) => form.set('adminNodeMail', e.target.checked)} />
          <CheckboxField label="When Parapet finds it had stopped watching" checked={form.values.adminSelfCheck} onChange={(e) => form.set('adminSelfCheck', e.target.checked)} />
          <CheckboxField label="Upstream notices" checked={form.values.upstreamNotices} onChange={(e) => form.set('upstreamNotices', e.target.checked)} />
        </fieldset>
      )}
      {!applies.operator && !applies.host && !applies.admin && <p className="text-sm text-muted">Parapet has no outage mail for you in your current role.</p>}
      <FormMessage message={form.formError} />
      <FormActions label="Save" busy={update.isPending} status={saved ? 'Saved.' : ''} />
    </form>
  );
}
