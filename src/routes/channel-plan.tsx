import { useState } from 'react';
import { Button } from '../components/button';
import { FormMessage, SelectField } from '../components/form-field';
import { PageHeader, Section } from '../components/page-header';
import { LoadError, Loading } from '../components/query-state';
import { useApplyChannelPlan, useChannelHistory, useChannelPlan } from '../features/planning/api/planning';
import { CongestionChart } from '../features/planning/components/congestion-chart';
import { SurveyUpload } from '../features/planning/components/survey-upload';
import { errorMessage } from '../lib/api';
import { formatDateTime } from '../lib/format';
import { bandOptions, isBand } from '../lib/channel-options';
import { PlanningCaution } from '../features/planning/components/planning-caution';

export function ChannelPlanPage() {
  const [band, setBand] = useState<'2.4' | '5'>('2.4');
  const plan = useChannelPlan({ band });
  const apply = useApplyChannelPlan();
  const history = useChannelHistory();
  const changed = plan.data?.radios.filter((r) => r.changed && r.recommendedChannel !== null) ?? [];

  return (
    <>
      <PageHeader
        title="Channel plan"
        subtitle="A channel for every radio: apart from its own node’s radios, away from near neighbours and from what the surveys heard."
      />
      <div className="max-w-xs">
        <SelectField label="Band" value={band} onChange={(e) => isBand(e.target.value) && setBand(e.target.value)} options={bandOptions} />
      </div>

      <Section title="Recommended channels">
        {plan.isPending ? (
          <Loading />
        ) : plan.isError ? (
          <LoadError error={plan.error} />
        ) : (
          <div className="space-y-3">
            <p className="text-sm text-muted">
              Region {plan.data.region}: only its allowed channels are used. Interference is the power other radios (by distance, free-space loss) and surveyed
              networks would put on the channel.
            </p>
            <div className="overflow-x-auto rounded-lg border border-line bg-surface">
              <table className="w-full text-sm" data-testid="channel-plan-table">
                <thead className="bg-sunken text-left text-xs text-muted uppercase">
                  <tr>
                    <th className="px-3 py-2">Node</th>
                    <th className="px-3 py-2">Radio</th>
                    <th className="px-3 py-2">Width</th>
                    <th className="px-3 py-2">Now</th>
                    <th className="px-3 py-2">Recommended</th>
                    <th className="px-3 py-2">Interference</th>
                  </tr>
                </thead>
                <tbody>
                  {plan.data.radios.length === 0 && (
                    <tr>
                      <td colSpan={6} className="px-3 py-4 text-muted">
                        No {band} GHz radios you plan.
                      </td>
                    </tr>
                  )}
                  {plan.data.radios.map((r) => (
                    <tr key={r.radioId} className="border-t border-line">
                      <td className="px-3 py-2">{r.nodeName}</td>
                      <td className="px-3 py-2">{r.iface}</td>
                      <td className="px-3 py-2">{r.channelWidthMHz} MHz</td>
                      <td className="px-3 py-2">{r.currentChannel}</td>
                      <td className="px-3 py-2 font-medium">
                        {r.recommendedChannel ?? '—'}
                        {r.changed && <span className="ml-1 text-xs text-accent">change</span>}
                      </td>
                      <td className="px-3 py-2 tabular-nums">{r.interferenceDbm === null ? '—' : `${r.interferenceDbm.toFixed(1)} dBm`}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
            {plan.data.skipped.map((s) => (
              <p key={s.radioId} className="text-sm text-danger">
                Radio {s.radioId}: {s.reason}
              </p>
            ))}
            <div className="flex flex-wrap items-center gap-3">
              <Button
                variant="primary"
                disabled={changed.length === 0 || apply.isPending}
                onClick={() =>
                  window.confirm(`Change the channel of ${changed.length} radio(s)? Their clients reconnect on the new channel.`) &&
                  apply.mutate({ assignments: changed.map((r) => ({ radioId: r.radioId, channel: r.recommendedChannel! })) })
                }
              >
                {apply.isPending ? 'Applying…' : `Apply ${changed.length} change${changed.length === 1 ? '' : 's'}`}
              </Button>
              {apply.isSuccess && (
                <p role="status" className="text-sm">
                  Updated {apply.data.updated} radio(s); the change is in the history below.
                </p>
              )}
              {apply.isError && <FormMessage message={errorMessage(apply.error, 'The plan could not be applied. Try again.')} />}
            </div>
          </div>
        )}
      </Section>

      <Section title="Congestion from site surveys">
        <div className="grid gap-4 lg:grid-cols-2">
          {plan.data?.congestion.map((c) => (
            <CongestionChart key={c.nodeId} title={`${c.nodeName} · surveyed ${formatDateTime(c.surveyedAt)}`} rows={c[band]} />
          ))}
          {plan.data && plan.data.congestion.length === 0 && <p className="text-sm text-muted">No survey yet. Upload one below.</p>}
        </div>
      </Section>

      <Section title="Upload a site survey">
        <SurveyUpload />
      </Section>

      <Section title="Applied changes">
        {history.data && history.data.length === 0 && <p className="text-sm text-muted">No channel changes applied yet.</p>}
        <ul className="space-y-1 text-sm">
          {history.data?.map((h) => (
            <li key={h.id}>
              {formatDateTime(h.changedAt)} — radio {h.radioId}: channel {h.before.channel} → {h.after.channel}
              {h.changedBy ? ` by ${h.changedBy}` : ''}
            </li>
          ))}
        </ul>
      </Section>
      <PlanningCaution />
    </>
  );
}
