// Where each node sits on the graph: its site's coordinates, flattened and scaled to fit.

export interface PlacedPoint {
  id: number;
  latitude: number;
  longitude: number;
}

export interface XY {
  x: number;
  y: number;
}

const EARTH_RADIUS_M = 6_371_008.8; // IUGG mean radius (Moritz, "Geodetic Reference System 1980")
const DEG = Math.PI / 180;

/**
 * Equirectangular projection with the standard parallel at φ1 (Snyder, "Map Projections — A
 * Working Manual", USGS Professional Paper 1395, 1987, eqs. 12-1 and 12-2):
 * x = R·(λ − λ0)·cos φ1, y = R·(φ − φ1). Returns metres east and north of (φ1, λ0).
 */
export function equirectangularM(
  latitudeDeg: number,
  longitudeDeg: number,
  centreLatitudeDeg: number,
  centreLongitudeDeg: number,
): { eastM: number; northM: number } {
  return {
    eastM: EARTH_RADIUS_M * (longitudeDeg - centreLongitudeDeg) * DEG * Math.cos(centreLatitudeDeg * DEG),
    northM: EARTH_RADIUS_M * (latitudeDeg - centreLatitudeDeg) * DEG,
  };
}

/** At zoom 1 a spot's nearest neighbour sits about this far away, so names fit between them. */
const NEAREST_SPACING_PX = 90;

/** The median distance from each spot to its nearest other spot (direct search; run once per layout). */
export function medianNearestM(spots: { eastM: number; northM: number }[]): number {
  if (spots.length < 2) return 0;
  const nearest = spots.map((a, i) => {
    let best = Infinity;
    for (let j = 0; j < spots.length; j++) {
      if (j === i) continue;
      const d = Math.hypot(a.eastM - spots[j].eastM, a.northM - spots[j].northM);
      if (d < best) best = d;
    }
    return best;
  });
  nearest.sort((x, y) => x - y);
  return nearest[Math.floor(nearest.length / 2)];
}

/** The widest the graph may grow, so one tight cluster cannot stretch a town across kilometres of pixels. */
export function maxSidePx(count: number): number {
  return Math.max(1200, Math.sqrt(count) * 160);
}

/** Nodes sharing a spot go round a small circle, about `spacingPx` apart, first one at the top. */
export function spreadOnCircle(centre: XY, count: number, spacingPx = 44): XY[] {
  if (count <= 1) return [centre];
  const radiusPx = Math.max(spacingPx * 0.75, (count * spacingPx) / (2 * Math.PI));
  return Array.from({ length: count }, (_, i) => {
    const angle = -Math.PI / 2 + (2 * Math.PI * i) / count;
    return { x: centre.x + radiusPx * Math.cos(angle), y: centre.y + radiusPx * Math.sin(angle) };
  });
}

/**
 * Pixel positions for every node (north up), centred on the mean position and scaled so that
 * neighbouring sites sit about 90 px apart, within a ceiling. Co-located nodes are spread apart.
 */
export function layoutByCoordinates(points: PlacedPoint[]): Map<number, XY> {
  const positions = new Map<number, XY>();
  if (points.length === 0) return positions;
  const meanLatitude = points.reduce((sum, p) => sum + p.latitude, 0) / points.length;
  const meanLongitude = points.reduce((sum, p) => sum + p.longitude, 0) / points.length;
  const metres = points.map((p) => equirectangularM(p.latitude, p.longitude, meanLatitude, meanLongitude));
  const spanM = Math.max(
    Math.max(...metres.map((m) => m.eastM)) - Math.min(...metres.map((m) => m.eastM)),
    Math.max(...metres.map((m) => m.northM)) - Math.min(...metres.map((m) => m.northM)),
  );
  const spots = [...new Map(metres.map((m) => [`${m.eastM.toFixed(1)},${m.northM.toFixed(1)}`, m])).values()];
  const nearestM = medianNearestM(spots);
  let pxPerM = nearestM > 0 ? NEAREST_SPACING_PX / nearestM : 1;
  if (spanM * pxPerM > maxSidePx(points.length)) pxPerM = maxSidePx(points.length) / spanM;

  // Group by the exact spot so nodes on one roof do not hide each other.
  const bySpot = new Map<string, { centre: XY; ids: number[] }>();
  points.forEach((p, i) => {
    const key = `${p.latitude.toFixed(6)},${p.longitude.toFixed(6)}`;
    const spot = bySpot.get(key) ?? { centre: { x: metres[i].eastM * pxPerM, y: -metres[i].northM * pxPerM }, ids: [] };
    spot.ids.push(p.id);
    bySpot.set(key, spot);
  });
  for (const spot of bySpot.values()) {
    const sorted = [...spot.ids].sort((a, b) => a - b);
    spreadOnCircle(spot.centre, sorted.length).forEach((xy, i) => positions.set(sorted[i], xy));
  }
  return positions;
}
