// Column types for Fanlight's own CSV formats: each turns the text of one cell into a value or
// a message that says what was expected. Empty cells of optional columns give `undefined`.
import { minutesOfDay, DAY_TYPES, type DayType } from '../../../shared/signals/time-of-day'

export class CellError extends Error {}

export interface CsvColumn<T = unknown> {
  name: string
  required: boolean
  /** For the README and the template comment: what the column holds, with its unit. */
  description: string
  example: string
  parse(cell: string): T
}

type Spec = { name: string; description: string; example: string; required?: boolean }

function column<T>(spec: Spec, parse: (cell: string) => T): CsvColumn<T> {
  return { required: true, ...spec, parse }
}

export function text(spec: Spec & { max?: number }): CsvColumn<string> {
  return column(spec, (c) => {
    if (c.length > (spec.max ?? 120)) throw new CellError(`Use at most ${spec.max ?? 120} characters.`)
    return c
  })
}

export function num(spec: Spec & { min: number; max: number; integer?: boolean; exclusiveMin?: boolean }): CsvColumn<number> {
  return column(spec, (c) => {
    if (!/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(c)) throw new CellError('Expected a number (use a point for decimals).')
    const v = Number(c)
    if (spec.integer && !Number.isInteger(v)) throw new CellError('Expected a whole number.')
    if (spec.exclusiveMin ? v <= spec.min : v < spec.min) throw new CellError(`Expected a value ${spec.exclusiveMin ? 'above' : 'of at least'} ${spec.min}.`)
    if (v > spec.max) throw new CellError(`Expected a value of at most ${spec.max}.`)
    return v
  })
}

export function oneOf<const V extends string>(spec: Spec, values: readonly V[]): CsvColumn<V> {
  return column(spec, (c) => {
    const v = values.find((x) => x === c.toLowerCase())
    if (!v) throw new CellError(`Expected one of: ${values.join(', ')}.`)
    return v
  })
}

export function bool(spec: Spec): CsvColumn<boolean> {
  return column(spec, (c) => {
    const v = c.toLowerCase()
    if (['yes', 'true', '1', 'y'].includes(v)) return true
    if (['no', 'false', '0', 'n'].includes(v)) return false
    throw new CellError('Expected yes or no.')
  })
}

export function timeOfDay(spec: Spec): CsvColumn<string> {
  return column(spec, (c) => {
    const hhmm = /^\d:\d\d$/.test(c) ? `0${c}` : c
    if (Number.isNaN(minutesOfDay(hhmm))) throw new CellError('Expected a time of day as HH:MM between 00:00 and 24:00.')
    return hhmm
  })
}

export function dayTypes(spec: Spec): CsvColumn<DayType[]> {
  return column(spec, (c) => {
    const parts = c.toLowerCase().split(/[;|\s]+/).filter(Boolean)
    const bad = parts.find((p) => !(DAY_TYPES as readonly string[]).includes(p))
    if (bad || !parts.length) throw new CellError(`Expected day types separated by ";": ${DAY_TYPES.join(', ')}.`)
    if (new Set(parts).size !== parts.length) throw new CellError('Give each day type once.')
    return parts as DayType[]
  })
}

export function optional<T>(col: CsvColumn<T>): CsvColumn<T | undefined> {
  return { ...col, required: false }
}
