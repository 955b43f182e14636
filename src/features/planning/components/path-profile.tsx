import { earthBulgeM, fresnelRadiusM } from '../../../../shared/radio/fresnel';
import { groundAtM, sightLineM, type GroundPoint, type Obstacle, type PathInput } from '../../../../shared/radio/lineOfSight';

export interface PathProfileProps {
  distanceKm: number;
  freqMHz: number;
  kFactor: number;
  a: { label: string; groundM: number; heightM: number };
  b: { label: string; groundM: number; heightM: number };
  obstacles: Obstacle[];
  /** Ground from elevation tiles, when the budget used them. */
  terrain?: GroundPoint[];
  worst?: { atDistanceKm: number; clear: boolean } | null;
}

const W = 640;
const H = 260;
const PAD = { left: 48, right: 16, top: 16, bottom: 28 };
const SAMPLES = 120;

/**
 * A side view of the path: the ground (from elevation tiles when known, else straight between the sites) raised by the
 * earth bulge for k (ITU-R P.526), obstacles as posts, both masts, the line of sight and the first Fresnel zone
 * (ITU-R P.526 Annex 1 §2.1). Heights are stretched against distance so they can be seen.
 */
export function PathProfile({ distanceKm, freqMHz, kFactor, a, b, obstacles, terrain, worst }: PathProfileProps) {
  const input: PathInput = {
    distanceKm,
    freqMHz,
    kFactor,
    aGroundM: a.groundM,
    aHeightM: a.heightM,
    bGroundM: b.groundM,
    bHeightM: b.heightM,
    obstacles,
    terrain,
  };
  const points = Array.from({ length: SAMPLES + 1 }, (_, i) => {
    const dKm = (i / SAMPLES) * distanceKm;
    const d2 = Math.max(0, distanceKm - dKm);
    const bulgeM = earthBulgeM(dKm, d2, kFactor);
    return {
      dKm,
      bulgeM,
      groundM: groundAtM(input, dKm) + bulgeM,
      sightM: sightLineM(input, dKm),
      fresnelM: dKm === 0 || d2 === 0 ? 0 : fresnelRadiusM(freqMHz, dKm, d2),
    };
  });
  const posts = obstacles.map((o) => ({
    ...o,
    baseM: groundAtM(input, o.distanceKm) + earthBulgeM(o.distanceKm, distanceKm - o.distanceKm, kFactor),
    topM: o.heightM + earthBulgeM(o.distanceKm, distanceKm - o.distanceKm, kFactor),
  }));
  const lo = Math.min(...points.map((p) => p.groundM - p.bulgeM), ...posts.map((p) => p.baseM)) - 2;
  const hi = Math.max(...points.map((p) => p.sightM + p.fresnelM), ...points.map((p) => p.groundM), ...posts.map((p) => p.topM)) + 4;
  const x = (dKm: number) => PAD.left + (dKm / distanceKm) * (W - PAD.left - PAD.right);
  const y = (m: number) => H - PAD.bottom - ((m - lo) / (hi - lo)) * (H - PAD.top - PAD.bottom);
  const line = (f: (p: (typeof points)[number]) => number) =>
    points.map((p, i) => `${i === 0 ? 'M' : 'L'}${x(p.dKm).toFixed(1)},${y(f(p)).toFixed(1)}`).join(' ');
  const upper = points.map((p) => `${x(p.dKm).toFixed(1)},${y(p.sightM + p.fresnelM).toFixed(1)}`);
  const lower = [...points].reverse().map((p) => `${x(p.dKm).toFixed(1)},${y(p.sightM - p.fresnelM).toFixed(1)}`);
  const ground = `${line((p) => p.groundM)} L${x(distanceKm)},${y(lo)} L${x(0)},${y(lo)} Z`;
  const mast = (dKm: number, end: PathProfileProps['a']) => (
    <g>
      <line x1={x(dKm)} x2={x(dKm)} y1={y(end.groundM)} y2={y(end.groundM + end.heightM)} stroke="currentColor" strokeWidth={3} />
      <circle cx={x(dKm)} cy={y(end.groundM + end.heightM)} r={4} fill="currentColor" />
    </g>
  );
  const ticks = [...new Set([lo, (lo + hi) / 2, hi].map((m) => Math.round(m)))];
  return (
    <figure className="rounded-lg border border-line bg-surface p-3" data-testid="path-profile">
      <svg
        viewBox={`0 0 ${W} ${H}`}
        role="img"
        aria-label={`Side view of the ${distanceKm.toFixed(2)} km path${obstacles.length ? ` with ${obstacles.length} obstacle(s)` : ''}`}
        className="h-auto w-full text-ink"
      >
        <path d={ground} className="fill-sunken" stroke="currentColor" strokeOpacity={0.5} data-testid="profile-ground" />
        <polygon points={[...upper, ...lower].join(' ')} className="fill-info stroke-info" fillOpacity={0.18} strokeOpacity={0.7} />
        <path d={line((p) => p.sightM)} fill="none" className="stroke-info" strokeWidth={1.8} />
        {posts.map((p, i) => (
          <g key={i} data-testid="profile-obstacle">
            <rect
              x={x(p.distanceKm) - 3}
              width={6}
              y={y(Math.max(p.topM, p.baseM))}
              height={Math.max(1, y(p.baseM) - y(Math.max(p.topM, p.baseM)))}
              className="fill-ground"
              fillOpacity={0.8}
            />
            <title>{`Obstacle ${i + 1}: top ${p.heightM} m at ${p.distanceKm} km from ${a.label}`}</title>
          </g>
        ))}
        {worst && !worst.clear && (
          <line
            x1={x(worst.atDistanceKm)}
            x2={x(worst.atDistanceKm)}
            y1={PAD.top}
            y2={H - PAD.bottom}
            className="stroke-state-offline"
            strokeDasharray="4 3"
            strokeWidth={1.5}
          />
        )}
        {mast(0, a)}
        {mast(distanceKm, b)}
        {ticks.map((m) => (
          <text key={m} x={PAD.left - 6} y={y(m) + 4} textAnchor="end" fontSize={11} fill="currentColor" opacity={0.7}>
            {m} m
          </text>
        ))}
        <text x={x(0)} y={H - 8} fontSize={11} fill="currentColor">
          {a.label}
        </text>
        <text x={x(distanceKm)} y={H - 8} fontSize={11} textAnchor="end" fill="currentColor">
          {b.label}
        </text>
        <text x={(x(0) + x(distanceKm)) / 2} y={H - 8} fontSize={11} textAnchor="middle" fill="currentColor" opacity={0.7}>
          {distanceKm.toFixed(2)} km
        </text>
      </svg>
      <figcaption className="mt-2 text-xs text-muted">
        Blue band: first Fresnel zone around the line of sight. Shaded ground:{' '}
        {terrain ? 'elevation from the uploaded terrain tiles' : 'a straight line between the two sites’ ground elevations (no terrain tiles used)'}, raised by
        the earth bulge (k = {kFactor.toFixed(2)}). Brown posts: the obstacles you entered; a dashed orange line marks where the path is not clear. Tiles do not
        show trees or buildings — walk the path.
      </figcaption>
    </figure>
  );
}
