// Reads a CSV file of one of Fanlight's own formats into typed records, collecting every problem
// with its line (the header is line 1), column and value instead of stopping at the first.
import Papa from 'papaparse'
import { CellError, type CsvColumn } from './columns'
import type { CsvLineError } from '../../../shared/schemas/signals'

export interface CsvRecord {
  line: number
  /** Parsed values by column name; absent optional cells are undefined. */
  values: Record<string, unknown>
  raw: Record<string, string>
}

export interface CsvReadResult {
  records: CsvRecord[]
  errors: CsvLineError[]
}

const MAX_ERRORS = 200

export function readCsv(text: string, columns: readonly CsvColumn[]): CsvReadResult {
  const errors: CsvLineError[] = []
  const records: CsvRecord[] = []
  const body = text.replace(/^\uFEFF/, '')
  let header: string[] | null = null
  let line = 1
  let consumed = 0

  Papa.parse<string[]>(body, {
    skipEmptyLines: false,
    step: (result) => {
      // Line of the first character of this row, counting newlines inside quoted cells too.
      const startLine = line
      const end = result.meta.cursor
      for (let i = consumed; i < end; i++) if (body.charCodeAt(i) === 10) line++
      consumed = end
      const cells = result.data.map((c) => c.trim())
      if (cells.every((c) => c === '')) return
      if (!header) {
        header = cells.map((c) => c.toLowerCase())
        checkHeader(header, columns, errors)
        return
      }
      if (errors.length >= MAX_ERRORS) return
      records.push(readRow(startLine, header, cells, columns, errors))
    },
  })
  if (!header) errors.push({ line: 1, column: '', value: '', message: 'The file is empty: it needs a header line and at least one data line.' })
  else if (!records.length && !errors.length) errors.push({ line: 2, column: '', value: '', message: 'The file has a header but no data lines.' })
  return { records, errors }
}

function checkHeader(header: string[], columns: readonly CsvColumn[], errors: CsvLineError[]) {
  const known = new Set(columns.map((c) => c.name))
  header.forEach((h) => {
    if (!known.has(h)) errors.push({ line: 1, column: h, value: h, message: `Unknown column "${h}". Download the template for the columns Fanlight reads.` })
  })
  const seen = new Set<string>()
  header.forEach((h) => {
    if (seen.has(h)) errors.push({ line: 1, column: h, value: h, message: `Column "${h}" appears twice.` })
    seen.add(h)
  })
  for (const c of columns) {
    if (c.required && !header.includes(c.name)) errors.push({ line: 1, column: c.name, value: '', message: `Required column "${c.name}" is missing.` })
  }
}

function readRow(line: number, header: string[], cells: string[], columns: readonly CsvColumn[], errors: CsvLineError[]): CsvRecord {
  const raw: Record<string, string> = {}
  const values: Record<string, unknown> = {}
  if (cells.length !== header.length) {
    errors.push({ line, column: '', value: '', message: `Expected ${header.length} cells as in the header, found ${cells.length}.` })
  }
  header.forEach((h, i) => { raw[h] = cells[i] ?? '' })
  for (const c of columns) {
    const cell = raw[c.name] ?? ''
    if (cell === '') {
      if (c.required && header.includes(c.name)) errors.push({ line, column: c.name, value: '', message: 'A value is required.' })
      continue
    }
    try {
      values[c.name] = c.parse(cell)
    } catch (err) {
      if (!(err instanceof CellError)) throw err
      errors.push({ line, column: c.name, value: cell, message: err.message })
    }
  }
  return { line, values, raw }
}

/** The header line and example lines of a template, quoted where needed. */
export function csvText(header: readonly string[], rows: readonly (readonly (string | number)[])[]): string {
  return Papa.unparse({ fields: [...header], data: rows.map((r) => r.map(String)) }, { newline: '\n' }) + '\n'
}
