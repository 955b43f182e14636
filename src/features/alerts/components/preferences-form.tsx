import { useState } from 'react';
import { OPERATOR_MAIL_MODES, preferencesUpdateSchema, type PreferencesDto, type PreferencesUpdate } from '../../../../shared/schemas/alerts';
import { CheckboxField, FormMessage, SelectField, TextField, FormActions } from '../../../components/form-field';
import { useSchemaForm } from '../../../lib/schema-form';
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
  const { applies } = preferences;
  const form = useSchemaForm({
    defaultValues: valuesOf(preferences),
    schema: preferencesUpdateSchema,
    // Only the groups that apply to this person are sent.
    toInput: (v) => ({
      ...(applies.operator ? { operatorMode: v.operatorMode, degradedDigest: v.degradedDigest } : {}),
      ...(applies.host ? { hostMail: v.hostMail, quietStart: v.quietStart || null, quietEnd: v.quietEnd || null } : {}),
      ...(applies.admin ? { adminNodeMail: v.adminNodeMail, adminSelfCheck: v.adminSelfCheck, upstreamNotices: v.upstreamNotices } : {}),
    }),
  });
  const { field } = form;
  const update = useUpdatePreferences();
  const [saved, setSaved] = useState(false);
  const send = form.handleSubmit(async (body) => {
    try {
      form.reset(valuesOf(await update.mutateAsync(body as PreferencesUpdate)));
      setSaved(true);
    } catch (error) {
      form.showServerError(error);
    }
  });

  return (
    <form
      onSubmit={(event) => {
        setSaved(false);
        void send(event);
      }}
      noValidate
      className="max-w-xl space-y-6"
      data-testid="preferences-form"
    >
      {preferences.unsubscribedAt && (
        <p className="rounded-md border border-line bg-sunken px-3 py-2 text-sm">
          You unsubscribed from all Parapet mail. Choosing any mail below turns it back on.
        </p>
      )}
      {applies.operator && (
        <fieldset className="space-y-3">
          <legend className="text-base font-semibold">Outages in your neighbourhoods</legend>
          <SelectField label="Outage mail" {...field('operatorMode')} options={OPERATOR_MAIL_MODES.map((m) => ({ value: m, label: MODE_LABELS[m] }))} />
          <CheckboxField label="Daily digest of nodes degraded for hours" {...field('degradedDigest')} />
        </fieldset>
      )}
      {applies.host && (
        <fieldset className="space-y-3">
          <legend className="text-base font-semibold">The node you host</legend>
          <CheckboxField label="Tell me when it stops answering and when it is back" {...field('hostMail')} />
          <div className="grid gap-3 sm:grid-cols-2">
            <TextField label="Quiet from" type="time" {...field('quietStart')} />
            <TextField
              label="Quiet until"
              type="time"
              {...field('quietEnd')}
              hint={`In the network's time zone (${preferences.timeZone}); mail waits until quiet hours end.`}
            />
          </div>
        </fieldset>
      )}
      {applies.admin && (
        <fieldset className="space-y-3">
          <legend className="text-base font-semibold">Admin mail</legend>
          <CheckboxField label="Outage mail for every node" {...field('adminNodeMail')} />
          <CheckboxField label="When Parapet finds it had stopped watching" {...field('adminSelfCheck')} />
          <CheckboxField label="Upstream notices" {...field('upstreamNotices')} />
        </fieldset>
      )}
      {!applies.operator && !applies.host && !applies.admin && <p className="text-sm text-muted">Parapet has no outage mail for you in your current role.</p>}
      <FormMessage message={form.formError} />
      <FormActions label="Save" busy={update.isPending} status={saved ? 'Saved.' : ''} />
    </form>
  );
}
