import { QueryTypes, type Sequelize } from 'sequelize';
import { PlanningError } from '../../shared/radio/errors';
import { geodesicDistanceKm, geodesicPoints, type GeoPoint } from '../../shared/radio/geodesy';
import type { GroundPoint } from '../../shared/radio/lineOfSight';
import { elevationM, tilesForPoint, type HgtTile } from '../../shared/terrain/hgt';

export interface TileSummary {
  name: string;
  south: number;
  west: number;
  samplesPerSide: number;
  createdAt: string;
}

/** Decoded tiles kept in memory by name and upload time, so a second budget over the same ground reads no bytea. */
const cache = new Map<string, { createdAt: number; tile: HgtTile }>();
const MAX_CACHED = 6;
/** A 1″ tile decodes to 26 MB; a path crossing more tiles than this is refused rather than risk the server's memory. */
export const MAX_TILES_PER_PATH = 8;

export async function saveTile(sequelize: Sequelize, tile: HgtTile, bytes: Uint8Array, userId: number): Promise<TileSummary> {
  const [row] = await sequelize.query<{ createdAt: Date }>(
    `INSERT INTO terrain_tiles (name, south, west, samples_per_side, data, uploaded_by) VALUES ($1, $2, $3, $4, $5, $6)
     ON CONFLICT (name) DO UPDATE SET data = EXCLUDED.data, samples_per_side = EXCLUDED.samples_per_side, uploaded_by = EXCLUDED.uploaded_by, created_at = now()
     RETURNING created_at AS "createdAt"`,
    {
      bind: [tile.name, tile.south, tile.west, tile.samplesPerSide, Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength), userId],
      type: QueryTypes.SELECT,
    },
  );
  cache.delete(tile.name);
  return { name: tile.name, south: tile.south, west: tile.west, samplesPerSide: tile.samplesPerSide, createdAt: row.createdAt.toISOString() };
}

export async function listTiles(sequelize: Sequelize): Promise<TileSummary[]> {
  const rows = await sequelize.query<Omit<TileSummary, 'createdAt'> & { createdAt: Date }>(
    `SELECT name, south, west, samples_per_side AS "samplesPerSide", created_at AS "createdAt" FROM terrain_tiles ORDER BY name`,
    { type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({ ...r, createdAt: r.createdAt.toISOString() }));
}

export async function deleteTile(sequelize: Sequelize, name: string): Promise<boolean> {
  const [, meta] = await sequelize.query(`DELETE FROM terrain_tiles WHERE name = $1`, { bind: [name] });
  cache.delete(name);
  return ((meta as { rowCount?: number })?.rowCount ?? 0) > 0;
}

async function loadTiles(sequelize: Sequelize, names: string[]): Promise<Map<string, HgtTile>> {
  const stamps = await sequelize.query<{ name: string; createdAt: Date; samplesPerSide: number }>(
    `SELECT name, created_at AS "createdAt", samples_per_side AS "samplesPerSide" FROM terrain_tiles WHERE name = ANY($1::text[])`,
    { bind: [names], type: QueryTypes.SELECT },
  );
  const out = new Map<string, HgtTile>();
  for (const s of stamps) {
    const hit = cache.get(s.name);
    if (hit && hit.createdAt === s.createdAt.getTime()) {
      out.set(s.name, hit.tile);
      continue;
    }
    const [row] = await sequelize.query<{ data: Buffer; south: number; west: number }>(`SELECT data, south, west FROM terrain_tiles WHERE name = $1`, {
      bind: [s.name],
      type: QueryTypes.SELECT,
    });
    const view = new DataView(row.data.buffer, row.data.byteOffset, row.data.byteLength);
    const samples = new Int16Array(s.samplesPerSide * s.samplesPerSide);
    for (let i = 0; i < samples.length; i++) samples[i] = view.getInt16(i * 2, false);
    const tile = { name: s.name, south: row.south, west: row.west, samplesPerSide: s.samplesPerSide, samples };
    if (cache.size >= MAX_CACHED) cache.delete(cache.keys().next().value!);
    cache.set(s.name, { createdAt: s.createdAt.getTime(), tile });
    out.set(s.name, tile);
  }
  return out;
}

/** Samples along the path: about one per 30 m (the 1″ grid), at least 100 and at most 2000. */
export function profileSamples(distanceKm: number): number {
  return Math.min(2000, Math.max(100, Math.ceil(distanceKm / 0.03)));
}

/**
 * Ground under the geodesic from a to b, bilinear in the tiles (shared/terrain/hgt.ts). A path that leaves the
 * uploaded tiles, or crosses a void, is a 400 naming the tile to upload or fill.
 */
export async function terrainProfile(sequelize: Sequelize, a: GeoPoint, b: GeoPoint): Promise<GroundPoint[]> {
  const n = profileSamples(geodesicDistanceKm(a, b));
  const points = geodesicPoints(a, b, n);
  const needed = [...new Set(points.flatMap((p) => tilesForPoint(p.lat, p.lon)))];
  const crossed = new Set(points.map((p) => tilesForPoint(p.lat, p.lon)[0]));
  if (crossed.size > MAX_TILES_PER_PATH) {
    throw new PlanningError(
      400,
      'terrain_path_too_long',
      `The path crosses ${crossed.size} elevation tiles; terrain profiles are drawn over at most ${MAX_TILES_PER_PATH} tiles. Plan it without terrain, or in shorter hops.`,
    );
  }
  const tiles = await loadTiles(sequelize, needed);
  const missing = new Set<string>();
  const out: GroundPoint[] = [];
  for (const p of points) {
    const names = tilesForPoint(p.lat, p.lon);
    let ground: number | null = null;
    let voidIn: string | null = null;
    for (const name of names) {
      const tile = tiles.get(name);
      if (!tile) continue;
      ground = elevationM(tile, p.lat, p.lon);
      if (ground !== null) break;
      voidIn = name;
    }
    if (ground === null) {
      if (voidIn) {
        throw new PlanningError(
          400,
          'terrain_void',
          `Tile ${voidIn} has no data (void) at ${p.lat.toFixed(4)}, ${p.lon.toFixed(4)}, ${p.distanceKm.toFixed(2)} km from a; upload a void-filled version of ${voidIn}.hgt.`,
        );
      }
      missing.add(names[0]);
      continue;
    }
    out.push({ distanceKm: p.distanceKm, groundM: ground });
  }
  if (missing.size > 0) {
    const list = [...missing].map((m) => `${m}.hgt`).join(', ');
    throw new PlanningError(
      400,
      'terrain_not_covered',
      `The path is not covered by the uploaded elevation tiles: missing ${list}. An admin can upload ${missing.size === 1 ? 'it' : 'them'} under Terrain tiles.`,
    );
  }
  return out;
}
