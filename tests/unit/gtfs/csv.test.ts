import { describe, expect, it } from 'vitest'
import { parseCsv, CsvEncodingError } from '../../../server/services/gtfs/csv'

async function* chunksOf(text: string | Uint8Array, size = 7) {
  const bytes = typeof text === 'string' ? new TextEncoder().encode(text) : text
  // Small chunks on purpose: lines, quotes and multi-byte characters get cut across chunks.
  for (let i = 0; i < bytes.length; i += size) yield bytes.subarray(i, i + size)
}

async function read(text: string | Uint8Array, size?: number) {
  const rows: { values: string[]; line: number }[] = []
  const malformed: { line: number; message: string }[] = []
  let header: string[] = []
  const result = await parseCsv(chunksOf(text, size), {
    header: (h) => { header = h },
    row: (values, line) => rows.push({ values, line }),
    malformed: (line, message) => malformed.push({ line, message }),
  })
  return { header, rows, malformed, result }
}

// CSV quirks GTFS Schedule allows (RFC 4180 quoting, UTF-8 with or without BOM, CRLF or LF).
describe('parseCsv', () => {
  it('strips a byte-order mark and trims header names', async () => {
    const { header, rows } = await read('\uFEFFstop_id , stop_name\nS1,Main\n')
    expect(header).toEqual(['stop_id', 'stop_name'])
    expect(rows).toEqual([{ values: ['S1', 'Main'], line: 2 }])
  })

  it('reads CRLF line ends', async () => {
    const { rows } = await read('a,b\r\n1,2\r\n3,4\r\n')
    expect(rows.map((r) => r.values)).toEqual([['1', '2'], ['3', '4']])
    expect(rows.map((r) => r.line)).toEqual([2, 3])
  })

  it('reads quoted fields with commas, doubled quotes and line breaks, and counts lines as an editor does', async () => {
    const { rows } = await read('id,name\n1,"Kestrel Ave, north"\n2,"The ""Harbour"" stop"\n3,"two\nlines"\n4,after\n')
    expect(rows.map((r) => r.values[1])).toEqual(['Kestrel Ave, north', 'The "Harbour" stop', 'two\nlines', 'after'])
    expect(rows.map((r) => r.line)).toEqual([2, 3, 4, 6])
  })

  it('skips blank lines but keeps counting them', async () => {
    const { rows } = await read('a\n1\n\n  \n2\n')
    expect(rows.map((r) => [r.values[0], r.line])).toEqual([['1', 2], ['2', 5]])
  })

  it('keeps multi-byte characters cut across chunks', async () => {
    const { rows } = await read('name\nZürich Straße 🚌\n', 3)
    expect(rows[0].values[0]).toBe('Zürich Straße 🚌')
  })

  it('reports an unterminated quote with its line and stops there', async () => {
    const { rows, malformed } = await read('a,b\n1,2\n3,"open\n4,5\n')
    expect(rows[0].values).toEqual(['1', '2'])
    expect(malformed).toHaveLength(1)
    expect(malformed[0].line).toBe(3)
    expect(malformed[0].message).toMatch(/not closed/)
  })

  it('says an empty file is empty', async () => {
    expect((await read('')).result).toEqual({ empty: true, dataRows: 0 })
    expect((await read('\n\n')).result.empty).toBe(true)
    expect((await read('a,b\n')).result).toEqual({ empty: false, dataRows: 0 })
  })

  it('refuses text that is not UTF-8', async () => {
    await expect(read(new Uint8Array([0x61, 0x0a, 0xff, 0xfe, 0x0a]))).rejects.toBeInstanceOf(CsvEncodingError)
  })
})
