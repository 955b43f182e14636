import { FADE_MARGIN_TARGET_DB, linkVerdict, type LinkVerdict } from '../../../../shared/radio/linkVerdict';
import type { LinkBudgetAnswer, RegulatoryAnswer } from '../api/types';

const VERDICT: Record<LinkVerdict, { word: string; tone: string; shape: string }> = {
  closes: { word: 'Closes with margin', tone: 'border-[#009E73] text-[#00795a] dark:text-[#3fd0a6]', shape: '●' },
  marginal: { word: 'Marginal', tone: 'border-[#E69F00] text-[#8a5f00] dark:text-[#f5c04d]', shape: '▲' },
  'will-not-close': { word: 'Will not close', tone: 'border-[#D55E00] text-[#b34f00] dark:text-[#ff8a3d]', shape: '■' },
};

const f = (v: number | null, unit: string, digits = 1) => (v === null ? '—' : `${v.toFixed(digits)} ${unit}`);

export function LinkVerdictBadge({ fadeMarginDb }: { fadeMarginDb: number }) {
  const v = VERDICT[linkVerdict(fadeMarginDb)];
  return (
    <div data-testid="link-verdict" className={`rounded-lg border-2 bg-surface p-3 ${v.tone}`}>
      <p className="text-lg font-semibold"><span aria-hidden="true">{v.shape} </span>{v.word}</p>
      <p className="mt-1 text-sm text-ink">
        Fade margin {fadeMarginDb.toFixed(1)} dB. Common practice, not a standard: {FADE_MARGIN_TARGET_DB} dB or more closes with room for rain, foliage
        and slight misalignment; 0–{FADE_MARGIN_TARGET_DB} dB may work on a clear day; below 0 dB the weakest rate cannot be received.
      </p>
    </div>
  );
}

/** Every figure of the link-budget answer, with its unit. */
export function LinkBudgetFigures({ answer }: { answer: LinkBudgetAnswer }) {
  const rows: [string, string][] = [
    ['Distance', f(answer.distanceKm, 'km', 3)],
    ['Azimuth a → b', f(answer.azimuthDeg, '°', 1)],
    ['Azimuth b → a', f(answer.reverseAzimuthDeg, '°', 1)],
    ['Antenna tilt at a', f(answer.tiltDeg, '°', 2)],
    ['Free-space path loss', f(answer.fsplDb, 'dB')],
    ['EIRP', f(answer.eirpDbm, 'dBm')],
    ['Expected received signal', f(answer.rxSignalDbm, 'dBm')],
    ['Noise floor', f(answer.noiseFloorDbm, 'dBm')],
    ['SNR', f(answer.snrDb, 'dB')],
    ['Expected rate (one stream)', f(answer.expectedRateMbps, 'Mb/s')],
    ['Fade margin', f(answer.fadeMarginDb, 'dB')],
    ['First Fresnel zone radius (mid-path)', f(answer.fresnelRadiusM, 'm', 2)],
    ['Earth bulge (mid-path, k = 4/3)', f(answer.earthBulgeM, 'm', 2)],
    ['Clearance needed (60 % zone + bulge)', f(answer.clearanceNeededM, 'm', 2)],
  ];
  return (
    <dl data-testid="link-budget-figures" className="grid gap-x-6 gap-y-2 rounded-lg border border-line bg-surface p-4 sm:grid-cols-2">
      {rows.map(([label, value]) => (
        <div key={label} className="flex justify-between gap-3 border-b border-line/60 py-1 text-sm last:border-0">
          <dt className="text-muted">{label}</dt>
          <dd className="font-medium tabular-nums">{value}</dd>
        </div>
      ))}
    </dl>
  );
}

export function RegulatoryVerdict({ region, answer, error }: { region: string; answer: RegulatoryAnswer | null; error: string | null }) {
  if (region === 'JP') {
    return <p data-testid="regulatory-verdict" className="rounded-lg border border-line bg-surface p-3 text-sm">The regulatory check is not available for Japan (JP) here; ask the regulator or a licensed installer for the limits.</p>;
  }
  if (error) return <p data-testid="regulatory-verdict" className="rounded-lg border border-danger/40 bg-danger-soft p-3 text-sm">{error}</p>;
  if (!answer) return null;
  return (
    <div data-testid="regulatory-verdict" className={`rounded-lg border-2 bg-surface p-3 text-sm ${answer.compliant ? 'border-[#009E73]' : 'border-[#D55E00]'}`}>
      <p className="font-semibold">
        <span aria-hidden="true">{answer.compliant ? '● ' : '■ '}</span>
        {answer.compliant ? `Within the ${region} limit` : `Over the ${region} limit`} — EIRP {answer.eirpDbm.toFixed(1)} dBm of at most {answer.maxEirpDbm.toFixed(1)} dBm;
        radio at most {answer.maxTxPowerDbm.toFixed(1)} dBm.
      </p>
      <p className="mt-1 text-muted">{answer.rule}</p>
    </div>
  );
}
