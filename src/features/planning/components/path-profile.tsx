import { pathProfile, worstClearanceM } from '../../../../shared/radio/pathProfile';

export interface PathProfileProps {
  distanceKm: number;
  freqMHz: number;
  a: { label: string; groundM: number; heightM: number };
  b: { label: string; groundM: number; heightM: number };
}

const W = 640;
const H = 240;
const PAD = { left: 44, right: 16, top: 16, bottom: 28 };

/**
 * A side view of the path: the ground (straight between the sites, raised by the earth bulge, k = 4/3), both
 * masts, the line of sight and the first Fresnel zone. Heights are stretched against distance so they can be seen.
 */
export function PathProfile({ distanceKm, freqMHz, a, b }: PathProfileProps) {
  const points = pathProfile({ distanceKm, freqMHz, aGroundM: a.groundM, aHeightM: a.heightM, bGroundM: b.groundM, bHeightM: b.heightM, samples: 60 });
  const lo = Math.min(0, ...points.map((p) => p.groundM - p.bulgeM)) ;
  const hi = Math.max(...points.map((p) => p.sightM + p.fresnelM), ...points.map((p) => p.groundM)) * 1.08 + 1;
  const x = (dKm: number) => PAD.left + (dKm / distanceKm) * (W - PAD.left - PAD.right);
  const y = (m: number) => H - PAD.bottom - ((m - lo) / (hi - lo)) * (H - PAD.top - PAD.bottom);
  const line = (f: (p: (typeof points)[number]) => number) => points.map((p, i) => `${i === 0 ? 'M' : 'L'}${x(p.dKm).toFixed(1)},${y(f(p)).toFixed(1)}`).join(' ');
  const upper = points.map((p) => `${x(p.dKm).toFixed(1)},${y(p.sightM + p.fresnelM).toFixed(1)}`);
  const lower = [...points].reverse().map((p) => `${x(p.dKm).toFixed(1)},${y(p.sightM - p.fresnelM).toFixed(1)}`);
  const ground = `${line((p) => p.groundM)} L${x(distanceKm)},${y(lo)} L${x(0)},${y(lo)} Z`;
  const flat = line((p) => p.groundM - p.bulgeM);
  const worst = worstClearanceM(points);
  const mast = (dKm: number, end: PathProfileProps['a']) => (
    <g>
      <line x1={x(dKm)} x2={x(dKm)} y1={y(end.groundM)} y2={y(end.groundM + end.heightM)} stroke="currentColor" strokeWidth={3} />
      <circle cx={x(dKm)} cy={y(end.groundM + end.heightM)} r={4} fill="currentColor" />
    </g>
  );
  const ticks = [lo, (lo + hi) / 2, hi].map((m) => Math.round(m));
  return (
    <figure className="rounded-lg border border-line bg-surface p-3" data-testid="path-profile">
      <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-label={`Side view of the ${distanceKm.toFixed(2)} km path`} className="h-auto w-full text-ink">
        <path d={ground} className="fill-sunken" stroke="currentColor" strokeOpacity={0.5} />
        <path d={flat} fill="none" stroke="currentColor" strokeOpacity={0.35} strokeDasharray="3 4" />
        <polygon points={[...upper, ...lower].join(' ')} fill="#56B4E9" fillOpacity={0.22} stroke="#0072B2" strokeOpacity={0.7} />
        <path d={line((p) => p.sightM)} fill="none" stroke="#0072B2" strokeWidth={1.8} />
        {mast(0, a)}
        {mast(distanceKm, b)}
        {ticks.map((m) => (
          <text key={m} x={PAD.left - 6} y={y(m) + 4} textAnchor="end" fontSize={11} fill="currentColor" opacity={0.7}>{m} m</text>
        ))}
        <text x={x(0)} y={H - 8} fontSize={11} fill="currentColor">{a.label}</text>
        <text x={x(distanceKm)} y={H - 8} fontSize={11} textAnchor="end" fill="currentColor">{b.label}</text>
        <text x={(x(0) + x(distanceKm)) / 2} y={H - 8} fontSize={11} textAnchor="middle" fill="currentColor" opacity={0.7}>{distanceKm.toFixed(2)} km</text>
      </svg>
      <figcaption className="mt-2 text-xs text-muted">
        Blue band: first Fresnel zone around the line of sight. Shaded ground: a straight line between the two sites’ ground
        elevations raised by the earth bulge (k = 4/3); the dashed line is the same ground without the bulge. No terrain or buildings are
        known here — walk the path. Worst clearance of 60 % of the zone over this ground:{' '}
        <strong className={worst < 0 ? 'text-danger' : ''}>{worst.toFixed(1)} m</strong>.
      </figcaption>
    </figure>
  );
}
