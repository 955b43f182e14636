import { useState } from 'react';
import { SelectField } from '../../../components/form-field';
import { LoadError, Loading } from '../../../components/query-state';
import { formatDateTime } from '../../../lib/format';
import { useLiveLinks } from '../api/inventory';
import { useLinkHealth } from '../api/planning';

const dbm = (v: number | null) => (v === null ? '—' : `${v.toFixed(1)} dBm`);

/** Measured signal beside the prediction for one live link; exported so the map or a node page can show it too. */
export function LinkHealthCard({ linkId }: { linkId: number }) {
  const health = useLinkHealth(linkId);
  if (health.isPending) return <Loading />;
  if (health.isError) return <LoadError error={health.error} />;
  const h = health.data;
  return (
    <div data-testid="link-health" className="space-y-2">
      {h.flagged && (
        <p role="alert" className="rounded-md border-2 border-danger bg-surface px-3 py-2 text-sm">
          <span aria-hidden="true">■ </span>
          <strong>Check this link:</strong> its signal is more than 10 dB below the prediction and more than 6 dB below its own
          {` ${h.baselineDays}`}-day median — an antenna knocked off aim or water in a connector are common causes.
        </p>
      )}
      <div className="overflow-x-auto rounded-lg border border-line bg-surface">
        <table className="w-full text-sm">
          <thead className="bg-sunken text-left text-xs text-muted uppercase">
            <tr>
              <th className="px-3 py-2">Received at</th>
              <th className="px-3 py-2">Predicted</th>
              <th className="px-3 py-2">Measured</th>
              <th className="px-3 py-2">{h.baselineDays}-day median</th>
              <th className="px-3 py-2">Verdict</th>
            </tr>
          </thead>
          <tbody>
            {h.directions.map((d) => (
              <tr key={d.toRadioId} className="border-t border-line">
                <td className="px-3 py-2">{d.toNodeName}</td>
                <td className="px-3 py-2 tabular-nums">{dbm(d.predictedSignalDbm)}</td>
                <td className="px-3 py-2 tabular-nums">
                  {dbm(d.measuredSignalDbm)}
                  {d.measuredAt && <span className="block text-xs text-muted">{formatDateTime(d.measuredAt)}</span>}
                </td>
                <td className="px-3 py-2 tabular-nums">
                  {dbm(d.baselineSignalDbm)}
                  <span className="block text-xs text-muted">{d.baselineSamples} reports</span>
                </td>
                <td className="px-3 py-2">
                  {d.measuredSignalDbm === null ? 'No report yet' : d.flagged ? <strong className="text-danger">■ Well below both</strong> : '● As expected'}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}

export function LinkHealthPanel() {
  const links = useLiveLinks();
  const [linkId, setLinkId] = useState('');
  if (links.isError) return <LoadError error={links.error} />;
  return (
    <div className="space-y-3">
      <div className="max-w-md">
        <SelectField
          label="Live link"
          value={linkId}
          onChange={(e) => setLinkId(e.target.value)}
          placeholder={links.data?.length === 0 ? 'No live links yet' : 'Choose a live link'}
          options={(links.data ?? []).map((l) => ({ value: String(l.id), label: l.name ?? `Link ${l.id}` }))}
        />
      </div>
      {linkId && <LinkHealthCard linkId={Number(linkId)} />}
    </div>
  );
}
