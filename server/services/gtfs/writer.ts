// Rows bound for COPY are written as CSV to a scratch file while the feed is checked, so memory
// stays flat however large the feed, and the database is only touched once everything passed.
import { closeSync, openSync, writeSync } from 'node:fs'
import path from 'node:path'

const FLUSH_CHARS = 1 << 20
/** COPY is fed slices of about this many bytes, each ending at a line end. */
const COPY_CHUNK_BYTES = 16 * 1024 * 1024

/** A CSV field for PostgreSQL's COPY: empty means NULL; quotes only when needed. */
export function csv(value: string | null | undefined): string {
  if (value == null || value === '') return ''
  for (let i = 0; i < value.length; i++) {
    const c = value.charCodeAt(i)
    if (c === 34 || c === 44 || c === 10 || c === 13) return `"${value.replaceAll('"', '""')}"`
  }
  return value
}

export class TableWriter {
  readonly file: string
  rows = 0
  /** After the first error nothing more will be loaded: stop writing, keep counting. */
  discard = false
  private fd: number
  private parts: string[] = []
  private chars = 0
  private bytes = 0
  private chunkStart = 0
  readonly chunks: { start: number; end: number }[] = []

  constructor(dir: string, readonly table: string, readonly columns: readonly string[]) {
    this.file = path.join(dir, `${table}.csv`)
    this.fd = openSync(this.file, 'w')
  }

  /** One row, already CSV, without the line end. */
  line(text: string) {
    this.rows++
    if (this.discard) return
    this.parts.push(text)
    this.chars += text.length + 1
    if (this.chars >= FLUSH_CHARS) this.flush()
  }

  private flush() {
    if (this.parts.length === 0) return
    this.parts.push('')
    const buf = Buffer.from(this.parts.join('\n'))
    writeSync(this.fd, buf)
    this.bytes += buf.length
    this.parts = []
    this.chars = 0
    if (this.bytes - this.chunkStart >= COPY_CHUNK_BYTES) {
      this.chunks.push({ start: this.chunkStart, end: this.bytes })
      this.chunkStart = this.bytes
    }
  }

  close() {
    this.flush()
    if (this.bytes > this.chunkStart) this.chunks.push({ start: this.chunkStart, end: this.bytes })
    this.chunkStart = this.bytes
    closeSync(this.fd)
  }

  /** Forget what was written (the file is read again from its first line). */
  reset() {
    this.parts = []
    this.chars = 0
    this.rows = 0
    closeSync(this.fd)
    this.fd = openSync(this.file, 'w')
    this.bytes = 0
    this.chunkStart = 0
    this.chunks.length = 0
  }
}
