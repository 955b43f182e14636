import type { CongestionRow } from '../api/types';

const FLOOR_DBM = -100;
const TOP_DBM = -30;
const heard = (dbm: number | null) => (dbm === null ? 'nothing heard' : `${dbm} dBm`);

/** Power heard per channel from the node's newest survey, as bars from −100 dBm up. */
export function CongestionChart({ title, rows }: { title: string; rows: CongestionRow[] }) {
  const W = Math.max(320, rows.length * 28 + 50);
  const H = 180;
  const base = H - 24;
  const scale = (dbm: number) => ((Math.min(TOP_DBM, Math.max(FLOOR_DBM, dbm)) - FLOOR_DBM) / (TOP_DBM - FLOOR_DBM)) * (base - 12);
  return (
    <figure className="min-w-0 rounded-lg border border-line bg-surface p-3" data-testid="congestion-chart">
      <figcaption className="mb-1 text-sm font-medium">{title}</figcaption>
      <div className="overflow-x-auto">
        <svg viewBox={`0 0 ${W} ${H}`} width={W} height={H} role="img" aria-label={`${title}: power heard per channel`} className="text-ink">
          {[-90, -70, -50].map((d) => (
            <g key={d}>
              <line x1={40} x2={W} y1={base - scale(d)} y2={base - scale(d)} stroke="currentColor" strokeOpacity={0.12} />
              <text x={36} y={base - scale(d) + 4} fontSize={10} textAnchor="end" fill="currentColor" opacity={0.7}>
                {d}
              </text>
            </g>
          ))}
          {rows.map((r, i) => {
            const h = r.congestionDbm === null ? 0 : scale(r.congestionDbm);
            const x = 46 + i * 28;
            const loud = r.congestionDbm !== null && r.congestionDbm > -70;
            return (
              <g key={r.channel}>
                <title>{`Channel ${r.channel}: ${heard(r.congestionDbm)}, ${r.networks} network(s) on it`}</title>
                <rect x={x} y={base - h} width={20} height={h} className={loud ? 'fill-state-offline' : 'fill-info'} fillOpacity={0.8} />
                <text x={x + 10} y={H - 8} fontSize={10} textAnchor="middle" fill="currentColor">
                  {r.channel}
                </text>
              </g>
            );
          })}
        </svg>
      </div>
      <p className="text-xs text-muted">dBm heard per 20 MHz channel; each network is spread over the channels its width covers. Orange: above −70 dBm.</p>
    </figure>
  );
}
