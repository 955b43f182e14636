import { PlanningError } from '../radio/errors';

// SRTM elevation tiles (.hgt): N×N big-endian signed 16-bit samples in metres, rows north to south, −32768 void;
// N = 1201 (3″) or 3601 (1″); the file name gives the south-west corner (N47W039 covers 47–48° N, 39–38° W).

export const HGT_VOID = -32768;
export const HGT_SIDES = [1201, 3601] as const;
/** Lowest and highest plausible ground in metres (Dead Sea shore, Everest), with room to spare. */
const PLAUSIBLE_M: [number, number] = [-500, 9000];

export interface HgtTile {
  name: string;
  south: number;
  west: number;
  samplesPerSide: number;
  samples: Int16Array;
}

const pad = (n: number, width: number) => String(Math.abs(n)).padStart(width, '0');
/** The tile name for a south-west corner: N47W039, S01E036. */
export function tileName(south: number, west: number): string {
  return `${south >= 0 ? 'N' : 'S'}${pad(south, 2)}${west >= 0 ? 'E' : 'W'}${pad(west, 3)}`;
}

/** South-west corner from a file name like N47W039.hgt (case-insensitive), or a 400 saying what a name looks like. */
export function parseTileName(fileName: string): { name: string; south: number; west: number } {
  const m = /^([NS])(\d{2})([EW])(\d{3})\.hgt$/i.exec(fileName.trim());
  const hint = 'an SRTM tile is named after its south-west corner, like N47W039.hgt';
  if (!m) throw new PlanningError(400, 'bad_tile_name', `"${fileName}" is not an SRTM tile name: ${hint}.`);
  const south = (m[1].toUpperCase() === 'S' ? -1 : 1) * Number(m[2]);
  const west = (m[3].toUpperCase() === 'W' ? -1 : 1) * Number(m[4]);
  if (south < -90 || south > 89 || west < -180 || west > 179) {
    throw new PlanningError(400, 'bad_tile_name', `"${fileName}" names a corner outside the globe (latitude −90 to 89, longitude −180 to 179): ${hint}.`);
  }
  return { name: tileName(south, west), south, west };
}

/** Reads and checks a tile: size, byte order (plausible heights) and data present. */
export function parseHgt(fileName: string, bytes: Uint8Array): HgtTile {
  const { name, south, west } = parseTileName(fileName);
  const side = HGT_SIDES.find((n) => n * n * 2 === bytes.length);
  if (!side) {
    throw new PlanningError(
      400,
      'bad_tile_size',
      `${name}.hgt is ${bytes.length.toLocaleString('en')} bytes; an SRTM tile is 2,884,802 bytes (1201 × 1201 samples, 3″) or 25,934,402 bytes (3601 × 3601, 1″). Upload the unzipped .hgt file.`,
    );
  }
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const samples = new Int16Array(side * side);
  let valid = 0;
  let implausible = 0;
  for (let i = 0; i < samples.length; i++) {
    const v = view.getInt16(i * 2, false);
    samples[i] = v;
    if (v === HGT_VOID) continue;
    valid++;
    if (v < PLAUSIBLE_M[0] || v > PLAUSIBLE_M[1]) implausible++;
  }
  if (valid === 0)
    throw new PlanningError(400, 'tile_all_void', `${name}.hgt holds no elevation at all (every sample is void, −32768); use a void-filled tile.`);
  if (implausible > valid / 100) {
    throw new PlanningError(
      400,
      'tile_implausible',
      `${name}.hgt has ${implausible.toLocaleString('en')} heights outside −500 to 9000 m: it is not a big-endian SRTM tile (byte order swapped, or another format).`,
    );
  }
  return { name, south, west, samplesPerSide: side, samples };
}

/** Tiles that hold a point: usually one; a point on a tile edge is also in its neighbour. */
export function tilesForPoint(lat: number, lon: number): string[] {
  const souths = Number.isInteger(lat) ? [lat, lat - 1] : [Math.floor(lat)];
  const wests = Number.isInteger(lon) ? [lon, lon - 1] : [Math.floor(lon)];
  return souths.flatMap((s) => wests.map((w) => tileName(s, w)));
}

/** Ground at a point by bilinear interpolation of the four surrounding samples; null outside the tile or on void. */
export function elevationM(tile: HgtTile, lat: number, lon: number): number | null {
  const n = tile.samplesPerSide;
  const row = (tile.south + 1 - lat) * (n - 1);
  const col = (lon - tile.west) * (n - 1);
  if (row < 0 || col < 0 || row > n - 1 || col > n - 1) return null;
  const r0 = Math.min(Math.floor(row), n - 2);
  const c0 = Math.min(Math.floor(col), n - 2);
  const fr = row - r0;
  const fc = col - c0;
  const at = (r: number, c: number) => tile.samples[r * n + c];
  const corners = [
    [at(r0, c0), (1 - fr) * (1 - fc)],
    [at(r0, c0 + 1), (1 - fr) * fc],
    [at(r0 + 1, c0), fr * (1 - fc)],
    [at(r0 + 1, c0 + 1), fr * fc],
  ];
  // A void corner drops out and the others are re-weighted; all four void means no data here.
  let sum = 0;
  let weight = 0;
  for (const [v, w] of corners) {
    if (v === HGT_VOID) continue;
    sum += v * w;
    weight += w;
  }
  if (weight === 0) return null;
  return sum / weight;
}
