// A corridor's representative shape as a polyline in metres, and the projection of points onto
// it (nearest point of the polyline; distance along it and the perpendicular offset, metres).
import { cumulativeDistanceM, projectOntoPolyline } from '../gtfs/geo'

export interface ShapeLine {
  lat: Float64Array
  lon: Float64Array
  cumM: Float64Array
  lengthM: number
}

export function shapeLine(points: readonly { lat: number; lon: number }[]): ShapeLine {
  const lat = Float64Array.from(points, (p) => p.lat)
  const lon = Float64Array.from(points, (p) => p.lon)
  const cumM = cumulativeDistanceM(lat, lon)
  return { lat, lon, cumM, lengthM: cumM.length ? cumM[cumM.length - 1] : 0 }
}

export interface Snap { distanceM: number; offsetM: number }

/** Nearest point of the whole shape to (lat, lon). */
export function snapToShape(line: ShapeLine, lat: number, lon: number): Snap {
  const p = projectOntoPolyline(lat, lon, line.lat, line.lon, line.cumM)
  return { distanceM: p.distM, offsetM: p.offsetM }
}

/** Stops farther than this from the representative shape are not on the corridor (common practice: stops sit at the kerb, 5-30 m from a shape). */
export const STOP_MAX_OFFSET_M = 60
