import { FADE_MARGIN_COMFORTABLE_DB, FADE_MARGIN_TARGET_DB, MARGIN_BANDS, linkVerdict, type LinkVerdict } from '../../../../shared/radio/linkVerdict';
import type { LinkBudgetAnswer, RegulatoryAnswer } from '../api/types';

// One scale with the map: the same words, colours (the map's link colours) and a shape per band.
const SHAPE: Record<LinkVerdict, string> = { comfortable: '●', thin: '◆', 'at-risk': '▲' };
const label = (band: LinkVerdict) => MARGIN_BANDS.find((b) => b.band === band)!.label;

const f = (v: number | null, unit: string, digits = 1) => (v === null ? '—' : `${v.toFixed(digits)} ${unit}`);

/** The verdict: the margin's band, overruled by a blocked path (a margin means nothing without line of sight). */
export function LinkVerdictBadge({ answer }: { answer: LinkBudgetAnswer }) {
  const blocked = answer.lineOfSight !== null && answer.lineOfSight.worstClearanceM < 0;
  const band: LinkVerdict = blocked ? 'at-risk' : linkVerdict(answer.fadeMarginDb);
  const word = blocked ? 'At risk — line of sight blocked' : answer.fadeMarginDb < 0 ? 'At risk — will not close' : label(band);
  return (
    <div data-testid="link-verdict" data-band={band} className="rounded-lg border-2 bg-surface p-3" style={{ borderColor: `var(--pp-link-${band})` }}>
      <p className="text-lg font-semibold">
        <span aria-hidden="true">{SHAPE[band]} </span>
        {word}
      </p>
      <p className="mt-1 text-sm text-ink">
        Fade margin {answer.fadeMarginDb.toFixed(1)} dB at the slowest rate. Parapet’s bands, the same as on the map (common practice, not a standard):{' '}
        {FADE_MARGIN_COMFORTABLE_DB} dB or more is comfortable; {FADE_MARGIN_TARGET_DB}–{FADE_MARGIN_COMFORTABLE_DB} dB is thin but usually enough; under{' '}
        {FADE_MARGIN_TARGET_DB} dB it drops in rain or foliage; below 0 dB the slowest rate cannot be received.
        {answer.lineOfSight && !answer.lineOfSight.clear && ' The path is not clear of 60 % of the first Fresnel zone: see the warnings.'}
      </p>
    </div>
  );
}

export function LinkWarnings({ warnings }: { warnings: string[] }) {
  if (warnings.length === 0) return null;
  return (
    <section data-testid="link-warnings" aria-label="Warnings" className="rounded-lg border border-caution/40 bg-caution-soft p-3 text-sm">
      <h3 className="mb-1 font-semibold">Check before you build</h3>
      <ul className="list-disc space-y-1 pl-5">
        {warnings.map((w) => (
          <li key={w}>{w}</li>
        ))}
      </ul>
    </section>
  );
}

/** Every figure of the link-budget answer, with its unit. */
export function LinkBudgetFigures({ answer }: { answer: LinkBudgetAnswer }) {
  const los = answer.lineOfSight;
  const rows: [string, string][] = [
    ['Distance', f(answer.distanceKm, 'km', 3)],
    ['Azimuth a → b', f(answer.azimuthDeg, '°', 1)],
    ['Azimuth b → a', f(answer.reverseAzimuthDeg, '°', 1)],
    ['Antenna tilt at a', f(answer.tiltDeg, '°', 2)],
    ['Free-space path loss', f(answer.fsplDb, 'dB')],
    ['Diffraction loss (worst obstacle)', f(answer.diffractionLossDb, 'dB')],
    ['EIRP', f(answer.eirpDbm, 'dBm')],
    ['Expected received signal', f(answer.rxSignalDbm, 'dBm')],
    ['Noise floor', f(answer.noiseFloorDbm, 'dBm')],
    ['SNR', f(answer.snrDb, 'dB')],
    [
      `Expected rate (${answer.streams} stream${answer.streams === 2 ? 's' : ''}, ${answer.guardInterval} GI)`,
      answer.mcs === null ? '0 Mb/s' : `${answer.expectedRateMbps} Mb/s (MCS${answer.mcs})`,
    ],
    ['Fade margin (slowest rate)', f(answer.fadeMarginDb, 'dB')],
    ...(answer.targetMarginDb !== null ? [[`Margin at ${answer.targetRateMbps} Mb/s target`, f(answer.targetMarginDb, 'dB')] as [string, string]] : []),
    ['First Fresnel zone radius (mid-path)', f(answer.fresnelRadiusM, 'm', 2)],
    [`Earth bulge (mid-path, k = ${answer.kFactor.toFixed(2)})`, f(answer.earthBulgeM, 'm', 2)],
    [
      'Worst clearance over ground and obstacles',
      los ? `${los.worstClearanceM.toFixed(1)} m of ${los.requiredClearanceM.toFixed(1)} m at ${los.atDistanceKm.toFixed(2)} km` : '—',
    ],
    ['Radio horizon (k = 4/3)', f(answer.radioHorizonKm, 'km')],
    ['Round trip (2d/c)', f(answer.roundTripUs, 'µs')],
    ['Distance (ACK timeout) setting', `${answer.ackDistanceKm} km`],
  ];
  return (
    <dl data-testid="link-budget-figures" className="grid gap-x-6 gap-y-2 rounded-lg border border-line bg-surface p-4 sm:grid-cols-2">
      {rows.map(([label, value]) => (
        <div key={label} className="flex justify-between gap-3 border-b border-line/60 py-1 text-sm last:border-0">
          <dt className="text-muted">{label}</dt>
          <dd className="text-right font-medium tabular-nums">{value}</dd>
        </div>
      ))}
    </dl>
  );
}

/** 20, 40 and 80 MHz side by side for the same signal: wider carries more but needs 3 dB more per doubling. */
export function WidthTradeOff({ answer, currentWidth }: { answer: LinkBudgetAnswer; currentWidth: number }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-line bg-surface p-3">
      <table data-testid="width-trade-off" className="w-full text-sm tabular-nums">
        <caption className="mb-2 text-left font-semibold">Channel width trade-off (same power and path)</caption>
        <thead className="text-left text-muted">
          <tr>
            <th scope="col">Width</th>
            <th scope="col">Noise floor</th>
            <th scope="col">Rate</th>
            <th scope="col">Fade margin</th>
          </tr>
        </thead>
        <tbody>
          {answer.widthOptions.map((w) => (
            <tr key={w.channelWidthMHz} className={w.channelWidthMHz === currentWidth ? 'font-semibold' : ''}>
              <th scope="row" className="py-1 text-left font-medium">
                {w.channelWidthMHz} MHz{w.channelWidthMHz === currentWidth ? ' (chosen)' : ''}
              </th>
              <td>{w.noiseFloorDbm.toFixed(1)} dBm</td>
              <td>{w.mcs === null ? 'no link' : `${w.expectedRateMbps} Mb/s`}</td>
              <td>{w.fadeMarginDb.toFixed(1)} dB</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="mt-2 text-xs text-muted">
        Rates from the IEEE 802.11-2020 HT (20/40 MHz) and VHT (80 MHz) tables; sensitivity is 3 dB worse per doubling of width.
      </p>
    </div>
  );
}

export function RegulatoryVerdict({ region, answer, error }: { region: string; answer: RegulatoryAnswer | null; error: string | null }) {
  if (region === 'JP') {
    return (
      <p data-testid="regulatory-verdict" className="rounded-lg border border-line bg-surface p-3 text-sm">
        The regulatory check is not available for Japan (JP) here; ask the regulator or a licensed installer for the limits.
      </p>
    );
  }
  if (error)
    return (
      <p data-testid="regulatory-verdict" className="rounded-lg border border-danger/40 bg-danger-soft p-3 text-sm">
        {error}
      </p>
    );
  if (!answer) return null;
  return (
    <div
      data-testid="regulatory-verdict"
      className={`rounded-lg border-2 bg-surface p-3 text-sm ${answer.compliant ? 'border-state-online' : 'border-danger'}`}
    >
      <p className="font-semibold">
        <span aria-hidden="true">{answer.compliant ? '● ' : '■ '}</span>
        {answer.compliant ? `Within the ${region} rules` : `Not within the ${region} rules`} — EIRP {answer.eirpDbm.toFixed(1)} dBm of at most{' '}
        {answer.maxEirpDbm.toFixed(1)} dBm; radio at most {answer.maxTxPowerDbm.toFixed(1)} dBm; occupies {answer.occupiedMHz.lo}–{answer.occupiedMHz.hi} MHz.
      </p>
      {answer.problems.length > 0 && (
        <ul className="mt-1 list-disc pl-5">
          {answer.problems.map((p) => (
            <li key={p}>{p}</li>
          ))}
        </ul>
      )}
      <p className="mt-1 text-muted">{answer.rule}</p>
    </div>
  );
}
