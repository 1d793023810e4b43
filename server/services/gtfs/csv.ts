// CSV text of one GTFS file, streamed through papaparse: UTF-8 with or without a byte-order mark,
// LF or CRLF line ends, quoted fields (with commas, quotes or line breaks inside). Line numbers
// are those a text editor shows, counting the header as line 1 and the breaks inside quotes.
import { Readable } from 'node:stream'
import Papa from 'papaparse'

export interface CsvSink {
  header(fields: string[]): void
  /** Raw values (not trimmed), as many as the line has. */
  row(values: string[], line: number): void
  /** A line papaparse could not read (an unterminated or stray quote). */
  malformed(line: number, message: string): void
}

export interface CsvResult {
  /** No header line at all: the file is empty or blank. */
  empty: boolean
  dataRows: number
}

export class CsvEncodingError extends Error {}

async function* decode(chunks: AsyncIterable<Uint8Array>, seen: { quote: boolean }): AsyncGenerator<string> {
  // fatal: refuse text that is not UTF-8 rather than import replacement characters.
  const decoder = new TextDecoder('utf-8', { fatal: true })
  try {
    for await (const c of chunks) {
      const s = decoder.decode(c, { stream: true })
      if (!seen.quote && s.includes('"')) seen.quote = true
      if (s) yield s
    }
    const rest = decoder.decode()
    if (rest.includes('"')) seen.quote = true
    if (rest) yield rest
  } catch (err) {
    if (err instanceof TypeError) throw new CsvEncodingError('The file is not valid UTF-8 text.')
    throw err
  }
}

export function parseCsv(chunks: AsyncIterable<Uint8Array>, sink: CsvSink): Promise<CsvResult> {
  return new Promise((resolve, reject) => {
    let line = 1
    let header: string[] | null = null
    let dataRows = 0
    let failed: unknown = null
    let stopped = false
    // Without a quote so far, no field can hold a line break: skip looking for one.
    const seen = { quote: false }
    const stream = Readable.from(decode(chunks, seen), { objectMode: true })
    stream.on('error', (err) => { if (!failed) failed = err })
    Papa.parse<string[]>(stream as unknown as File, {
      delimiter: ',',
      skipEmptyLines: false,
      chunk(results, parser) {
        if (stopped) return
        try {
          const rows = results.data
          // Rows papaparse could not read are reported as such, not as rows with odd fields.
          const quoteErrors = new Map<number, string>()
          for (const e of results.errors) if (e.type === 'Quotes' && e.row != null && !quoteErrors.has(e.row)) quoteErrors.set(e.row, e.code)
          for (let i = 0; i < rows.length; i++) {
            const r = rows[i]
            const at = line
            // Breaks inside quoted fields advance the line count of what follows.
            let extra = 0
            if (seen.quote) for (let j = 0; j < r.length; j++) {
              const v = r[j]
              if (v.length > 0 && v.indexOf('\n') >= 0) for (let k = 0; k < v.length; k++) if (v.charCodeAt(k) === 10) extra++
            }
            line += 1 + extra
            const quote = quoteErrors.get(i)
            if (quote) {
              sink.malformed(at, quote === 'MissingQuotes'
                ? 'A quoted field is not closed: the rest of the file cannot be read.'
                : 'A quote is misplaced: a quoted field must end with a quote before the next comma.')
              if (quote === 'MissingQuotes') { stopped = true; parser.abort(); return }
              continue
            }
            if (r.length === 1 && r[0].trim() === '') continue
            if (!header) {
              header = r.map((h, k) => (k === 0 ? h.replace(/^\uFEFF/, '') : h).trim())
              sink.header(header)
              continue
            }
            dataRows++
            sink.row(r, at)
          }
        } catch (err) {
          failed = err
          stopped = true
          parser.abort()
        }
      },
      complete() {
        stream.destroy()
        if (failed) reject(failed)
        else resolve({ empty: header === null, dataRows })
      },
      error(err: Error) {
        stream.destroy()
        reject(failed ?? err)
      },
    })
  })
}
