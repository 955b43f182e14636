// Prints how long terrain work takes on this machine: decoding a synthetic 1″ SRTM tile, a 2,000-point profile, a budget over it.
// Run: npx tsx server/tools/benchTerrain.ts (no database; the tile is made here, never real data).
import { parseHgt, elevationM } from '../../shared/terrain/hgt';
import { computeLinkBudget } from '../../shared/radio/plan';
import { geodesicPoints } from '../../shared/radio/geodesy';
const N = 3601;
const buf = Buffer.alloc(N * N * 2);
for (let i = 0; i < N * N; i++) buf.writeInt16BE(100 + (i % 500), i * 2);
let t = performance.now();
const tile = parseHgt('N47E008.hgt', new Uint8Array(buf.buffer, buf.byteOffset, buf.byteLength));
console.log('parse 1″ tile (25.9 MB):', (performance.now() - t).toFixed(0), 'ms');
t = performance.now();
const pts = geodesicPoints({ lat: 47.05, lon: 8.05 }, { lat: 47.95, lon: 8.95 }, 2000);
const prof = pts.map((p) => ({ distanceKm: p.distanceKm, groundM: elevationM(tile, p.lat, p.lon)! }));
console.log('2000-point profile over', pts[2000].distanceKm.toFixed(1), 'km:', (performance.now() - t).toFixed(1), 'ms');
t = performance.now();
for (let i = 0; i < 20; i++)
  computeLinkBudget({
    a: { lat: 47.05, lon: 8.05, heightM: 30, groundElevationM: 100 },
    b: { lat: 47.95, lon: 8.95, heightM: 30, groundElevationM: 100 },
    freqMHz: 5500,
    channelWidthMHz: 20,
    txPowerDbm: 18,
    txAntennaGainDbi: 30,
    txCableLossDb: 0,
    rxAntennaGainDbi: 30,
    rxCableLossDb: 0,
    terrainProfile: prof,
  });
console.log('link budget with that profile:', ((performance.now() - t) / 20).toFixed(1), 'ms each');
