// Unit conversions at the edge of the model: the model itself works in metres, seconds and vehicles.
export const kmhToMps = (kmh: number): number => kmh / 3.6
export const mpsToKmh = (mps: number): number => mps * 3.6
export const perKmToPerM = (perKm: number): number => perKm / 1000
export const perMToPerKm = (perM: number): number => perM * 1000
export const perHourToPerS = (perHour: number): number => perHour / 3600
export const perSToPerHour = (perS: number): number => perS * 3600
