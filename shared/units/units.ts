// Units the client shows: metric or US customary, per organisation. Values stay SI (metres,
// km/h, vehicles per km) everywhere else; only what a person reads is converted. The foot and
// the mile are the international ones (1 ft = 0.3048 m exactly, 1 mi = 1609.344 m).
export type UnitSystem = 'metric' | 'us'

export const METRES_PER_FOOT = 0.3048
export const METRES_PER_MILE = 1609.344
export const KM_PER_MILE = METRES_PER_MILE / 1000

export interface Measure { value: number; unit: string }

const round = (x: number, digits: number) => Number(x.toFixed(digits))

/** A distance in the unit a reader expects for its size: m or km, ft or mi. */
export function distance(metres: number, system: UnitSystem): Measure {
  if (system === 'us') {
    const miles = metres / METRES_PER_MILE
    return Math.abs(miles) >= 0.2 ? { value: round(miles, 2), unit: 'mi' } : { value: Math.round(metres / METRES_PER_FOOT), unit: 'ft' }
  }
  return Math.abs(metres) >= 1000 ? { value: round(metres / 1000, 2), unit: 'km' } : { value: Math.round(metres), unit: 'm' }
}

/** Always in the larger unit (km or mi), for columns that must share one unit. */
export function longDistance(metres: number, system: UnitSystem): Measure {
  return system === 'us' ? { value: round(metres / METRES_PER_MILE, 2), unit: 'mi' } : { value: round(metres / 1000, 2), unit: 'km' }
}

export function speed(kmh: number, system: UnitSystem): Measure {
  return system === 'us' ? { value: round(kmh / KM_PER_MILE, 1), unit: 'mph' } : { value: round(kmh, 1), unit: 'km/h' }
}

/** Traffic density: vehicles per km or per mile. */
export function density(vehPerKm: number, system: UnitSystem): Measure {
  return system === 'us' ? { value: round(vehPerKm * KM_PER_MILE, 1), unit: 'veh/mi' } : { value: round(vehPerKm, 1), unit: 'veh/km' }
}

export const show = (m: Measure) => `${m.value.toLocaleString('en-GB')} ${m.unit}`
