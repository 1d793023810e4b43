// Distances on the Earth for shapes and stops. Haversine on a sphere of the mean Earth radius
// (IUGG, 6 371 008.8 m); within 0.5% of the ellipsoid, far below the spread of GTFS coordinates.

const R = 6_371_008.8
const RAD = Math.PI / 180

export function haversineM(lat1: number, lon1: number, lat2: number, lon2: number): number {
  const dLat = (lat2 - lat1) * RAD
  const dLon = (lon2 - lon1) * RAD
  const a = Math.sin(dLat / 2) ** 2 + Math.cos(lat1 * RAD) * Math.cos(lat2 * RAD) * Math.sin(dLon / 2) ** 2
  return 2 * R * Math.asin(Math.min(1, Math.sqrt(a)))
}

/** Cumulative distance in metres at each vertex of a polyline. */
export function cumulativeDistanceM(lat: ArrayLike<number>, lon: ArrayLike<number>): Float64Array {
  const out = new Float64Array(lat.length)
  for (let i = 1; i < lat.length; i++) out[i] = out[i - 1] + haversineM(lat[i - 1], lon[i - 1], lat[i], lon[i])
  return out
}

export interface Projection {
  /** Distance along the polyline in metres. */
  distM: number
  /** Index of the segment (its first vertex) the point projects onto. */
  segment: number
  /** Distance from the point to the polyline in metres. */
  offsetM: number
}

/**
 * Nearest point of the polyline to (lat, lon) at or after `fromDistM` along it (on segment
 * `fromSegment` or later): the stops of a trip are projected in order, so a route that passes a
 * stop twice finds the right pass and distances never go backwards. Each segment is projected
 * in a local equirectangular plane, exact enough for segments of a few hundred metres.
 */
export function projectOntoPolyline(
  lat: number, lon: number,
  pLat: ArrayLike<number>, pLon: ArrayLike<number>, cumM: ArrayLike<number>,
  fromSegment = 0, fromDistM = 0,
): Projection {
  const n = pLat.length
  if (n === 1) return { distM: cumM[0], segment: 0, offsetM: haversineM(lat, lon, pLat[0], pLon[0]) }
  const kx = Math.cos(lat * RAD) * RAD * R
  const ky = RAD * R
  const first = Math.min(Math.max(0, fromSegment), n - 2)
  let best: Projection = { distM: Math.max(fromDistM, cumM[first]), segment: first, offsetM: Infinity }
  for (let i = first; i < n - 1; i++) {
    const ax = (pLon[i] - lon) * kx, ay = (pLat[i] - lat) * ky
    const bx = (pLon[i + 1] - lon) * kx, by = (pLat[i + 1] - lat) * ky
    const dx = bx - ax, dy = by - ay
    const len2 = dx * dx + dy * dy
    const segM = cumM[i + 1] - cumM[i]
    // Where on this segment the search may start (0 except on the segment of the last stop).
    const tMin = segM > 0 && fromDistM > cumM[i] ? Math.min(1, (fromDistM - cumM[i]) / segM) : 0
    if (fromDistM > cumM[i + 1] && i < n - 2) continue
    let t = len2 > 0 ? -(ax * dx + ay * dy) / len2 : 0
    t = t < tMin ? tMin : t > 1 ? 1 : t
    const px = ax + t * dx, py = ay + t * dy
    const off = Math.sqrt(px * px + py * py)
    if (off < best.offsetM - 1e-9) best = { distM: cumM[i] + t * segM, segment: i, offsetM: off }
  }
  return best
}
