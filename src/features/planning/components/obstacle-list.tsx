import { Button } from '../../../components/button';
import { TextField } from '../../../components/form-field';

export interface ObstacleRow {
  distanceKm: string;
  heightM: string;
}

/** Obstacles on the path (a tree line, a building): distance from end A and the height of the top above the ground datum. */
export function ObstacleList({ value, onChange }: { value: ObstacleRow[]; onChange: (rows: ObstacleRow[]) => void }) {
  const set = (i: number, row: Partial<ObstacleRow>) => onChange(value.map((r, j) => (j === i ? { ...r, ...row } : r)));
  return (
    <fieldset className="rounded-lg border border-line bg-surface p-4" data-testid="obstacles">
      <legend className="px-1 text-sm font-semibold">Obstacles on the path</legend>
      <p className="mb-2 text-xs text-muted">
        A tree line or a building between the masts: its distance from A and the height of its top above the same datum as the ground elevations (sea level).
        The worst one is counted as a knife edge (ITU-R P.526).
      </p>
      {value.map((row, i) => (
        <div key={i} className="mb-2 grid grid-cols-[1fr_1fr_auto] items-end gap-2">
          <TextField
            label={`Obstacle ${i + 1} distance from A (km)`}
            inputMode="decimal"
            value={row.distanceKm}
            onChange={(e) => set(i, { distanceKm: e.target.value })}
          />
          <TextField label={`Obstacle ${i + 1} top height (m)`} inputMode="decimal" value={row.heightM} onChange={(e) => set(i, { heightM: e.target.value })} />
          <Button type="button" onClick={() => onChange(value.filter((_, j) => j !== i))}>
            Remove
          </Button>
        </div>
      ))}
      <Button type="button" onClick={() => onChange([...value, { distanceKm: '', heightM: '' }])} disabled={value.length >= 50}>
        Add obstacle
      </Button>
    </fieldset>
  );
}
