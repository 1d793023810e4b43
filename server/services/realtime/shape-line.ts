// A trip shape as a polyline in a local plane, for placing vehicle positions at a distance along it.
// An equirectangular projection about the shape's mean latitude is accurate to well under a metre
// over the few kilometres of a corridor, which is far inside GPS error. Distances along the shape
// are the GTFS import's own (haversine per vertex), so positions, stops and intersections share
// one measure.
import { cumulativeDistanceM } from '../../../shared/gtfs/geo'

const EARTH_RADIUS_M = 6_371_008.8

export interface LatLon {
  lat: number
  lon: number
}

export interface ShapeLine {
  xs: Float64Array
  ys: Float64Array
  /** Distance along the shape at each vertex, metres from the first vertex. */
  cum: Float64Array
  lengthM: number
  lat0: number
  lon0: number
  cosLat0: number
}

export function toPlane(line: Pick<ShapeLine, 'lat0' | 'lon0' | 'cosLat0'>, p: LatLon): [number, number] {
  const rad = Math.PI / 180
  return [(p.lon - line.lon0) * rad * EARTH_RADIUS_M * line.cosLat0, (p.lat - line.lat0) * rad * EARTH_RADIUS_M]
}

export function buildShapeLine(points: LatLon[]): ShapeLine {
  if (points.length < 2) throw new Error('a shape needs at least two points')
  const lat0 = points.reduce((s, p) => s + p.lat, 0) / points.length
  const lon0 = points.reduce((s, p) => s + p.lon, 0) / points.length
  const base = { lat0, lon0, cosLat0: Math.cos((lat0 * Math.PI) / 180) }
  const xs = new Float64Array(points.length)
  const ys = new Float64Array(points.length)
  points.forEach((p, i) => {
    const [x, y] = toPlane(base, p)
    xs[i] = x
    ys[i] = y
  })
  const cum = cumulativeDistanceM(points.map((p) => p.lat), points.map((p) => p.lon))
  return { xs, ys, cum, lengthM: cum[points.length - 1], ...base }
}

export interface Projection {
  distM: number
  /** Distance from the shape, metres. */
  offsetM: number
}

/**
 * The nearest point of the shape at or after minDistM (a bus does not run backwards along its
 * trip; starting the search there keeps loops and out-and-back shapes from snapping to the wrong
 * leg); maxDistM bounds how far it can have got since the last reading. Among equally near legs
 * the earliest wins.
 */
export function project(line: ShapeLine, p: LatLon, minDistM = 0, maxDistM = Infinity): Projection {
  const [px, py] = toPlane(line, p)
  let best: Projection = { distM: Math.max(0, minDistM), offsetM: Infinity }
  for (let i = 0; i < line.xs.length - 1; i++) {
    if (line.cum[i + 1] < minDistM) continue
    if (line.cum[i] > maxDistM) break
    const ax = line.xs[i], ay = line.ys[i]
    const dx = line.xs[i + 1] - ax, dy = line.ys[i + 1] - ay
    const len2 = dx * dx + dy * dy
    let u = len2 > 0 ? ((px - ax) * dx + (py - ay) * dy) / len2 : 0
    u = Math.min(1, Math.max(0, u))
    let dist = line.cum[i] + u * (line.cum[i + 1] - line.cum[i])
    let qx = ax + u * dx, qy = ay + u * dy
    if (dist < minDistM) {
      // Only the part of this leg past minDistM is allowed.
      const v = len2 > 0 ? (minDistM - line.cum[i]) / (line.cum[i + 1] - line.cum[i]) : 0
      qx = ax + v * dx
      qy = ay + v * dy
      dist = minDistM
    }
    const offset = Math.hypot(px - qx, py - qy)
    if (offset < best.offsetM - 1e-9) best = { distM: dist, offsetM: offset }
  }
  return best
}

/** The coordinates at a distance along the shape (for generating positions). */
export function pointAt(line: ShapeLine, distM: number): LatLon {
  const d = Math.min(line.lengthM, Math.max(0, distM))
  let i = 0
  while (i < line.cum.length - 2 && line.cum[i + 1] < d) i++
  const seg = line.cum[i + 1] - line.cum[i]
  const u = seg > 0 ? (d - line.cum[i]) / seg : 0
  const x = line.xs[i] + u * (line.xs[i + 1] - line.xs[i])
  const y = line.ys[i] + u * (line.ys[i + 1] - line.ys[i])
  const rad = Math.PI / 180
  return { lat: line.lat0 + y / (rad * EARTH_RADIUS_M), lon: line.lon0 + x / (rad * EARTH_RADIUS_M * line.cosLat0) }
}
