// One GTFS file from the archive, row by row: header checks, field counts, the zod row schema of
// shared/schemas/gtfs.ts. Rows that pass reach `onRow` as trimmed text; the rest become findings.
import type { z } from 'zod'
import { GTFS_ROW_SCHEMAS, requiredColumns, type GtfsFileName } from '../../../shared/schemas/gtfs'
import { parseCsv, CsvEncodingError } from './csv'
import { readEntry, type InflateBudget, type ZipArchive, type ZipEntry } from './zip'
import type { Findings } from './findings'

export type RowOf<F extends GtfsFileName> = z.infer<(typeof GTFS_ROW_SCHEMAS)[F]>

export interface ReadOutcome {
  /** The file had no header line at all. */
  empty: boolean
  /** Rows that passed their schema. */
  rows: number
  /** Data lines in the file, valid or not. */
  dataRows: number
  /** The header lacked a required column: no row was read. */
  unusable: boolean
}

export interface ReadContext {
  zip: ZipArchive
  budget: InflateBudget
  findings: Findings
  /** Awaited between chunks of the entry with the bytes inflated so far (progress). */
  onBytes?: (bytes: number) => Promise<void>
}

async function* counted(chunks: AsyncIterable<Uint8Array>, onBytes?: (n: number) => Promise<void>) {
  let n = 0
  let last = 0
  for await (const c of chunks) {
    n += c.length
    yield c
    if (onBytes && n - last >= 512 * 1024) { last = n; await onBytes(n) }
  }
  if (onBytes) await onBytes(n)
}

export async function readGtfsFile<F extends GtfsFileName>(
  ctx: ReadContext, file: F, entry: ZipEntry, onRow: (row: RowOf<F>, line: number) => void,
): Promise<ReadOutcome> {
  const schema = GTFS_ROW_SCHEMAS[file] as unknown as z.ZodType<RowOf<F>>
  const fields = Object.keys(GTFS_ROW_SCHEMAS[file].shape)
  const { findings } = ctx
  let index: number[] = []
  let width = 0
  let unusable = false
  let rows = 0
  try {
    const result = await parseCsv(counted(readEntry(ctx.zip, entry, ctx.budget), ctx.onBytes), {
      header(names) {
        width = names.length
        const seen = new Set<string>()
        names.forEach((n, i) => {
          if (seen.has(n)) findings.error('duplicate_column', { file, line: 1, field: n, value: n, message: `The column ${n} appears twice in the header.` })
          if (n === '') findings.warning('blank_column', { file, line: 1, field: null, value: null, message: `Column ${i + 1} of the header has no name; it is ignored.` })
          seen.add(n)
        })
        if (seen.size < names.length) unusable = true
        index = fields.map((f) => names.indexOf(f))
        for (const col of requiredColumns(file)) {
          if (!names.includes(col)) {
            unusable = true
            findings.error('missing_column', { file, line: 1, field: col, value: null, message: `The header has no ${col} column, which this file requires.` })
          }
        }
      },
      row(values, line) {
        if (unusable) return
        if (values.length !== width) {
          findings.error('malformed_line', {
            file, line, field: null, value: values.join(',').slice(0, 200),
            message: `The line has ${values.length} field${values.length === 1 ? '' : 's'}; the header has ${width}.`,
          })
          return
        }
        const obj: Record<string, string> = {}
        for (let i = 0; i < fields.length; i++) {
          const k = index[i]
          obj[fields[i]] = k < 0 ? '' : values[k].trim()
        }
        const parsed = schema.safeParse(obj)
        if (!parsed.success) {
          for (const issue of parsed.error.issues) {
            const field = String(issue.path[0] ?? '')
            findings.error('invalid_value', { file, line, field: field || null, value: field ? obj[field] : null, message: issue.message })
          }
          return
        }
        rows++
        onRow(obj as RowOf<F>, line)
      },
      malformed(line, message) {
        findings.error('malformed_line', { file, line, field: null, value: null, message })
      },
    })
    return { empty: result.empty, rows, dataRows: result.dataRows, unusable }
  } catch (err) {
    if (err instanceof CsvEncodingError) {
      findings.error('encoding', { file, line: null, field: null, value: null, message: err.message })
      return { empty: false, rows, dataRows: rows, unusable: true }
    }
    throw err
  }
}
