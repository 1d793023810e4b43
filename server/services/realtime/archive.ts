// Turns an upload (one .pb, many, or zips of them) into a flat list of named FeedMessage files.
// Zips are inflated as a stream with caps on the entry count and on the inflated bytes actually
// produced (not the sizes the archive claims), so a crafted archive cannot exhaust memory.
import { Unzip, UnzipInflate, type UnzipFile } from 'fflate'

export interface UploadedFile {
  name: string
  data: Uint8Array
}

export interface ArchiveLimits {
  maxEntries: number
  maxEntryBytes: number
  maxTotalBytes: number
}

export const DEFAULT_ARCHIVE_LIMITS: ArchiveLimits = {
  maxEntries: 20_000,
  maxEntryBytes: 16 * 1024 * 1024,
  maxTotalBytes: 1024 * 1024 * 1024,
}

/** A file to decode, or a problem that keeps an entry (or a whole archive) from being read. */
export type CollectedFile =
  | { name: string; data: Uint8Array }
  | { name: string; skipped: string }
  | { name: string; error: { code: 'bad_archive' | 'too_large' | 'too_many_entries'; message: string } }

const isZip = (f: UploadedFile) =>
  f.name.toLowerCase().endsWith('.zip') || (f.data[0] === 0x50 && f.data[1] === 0x4b && f.data[2] === 0x03 && f.data[3] === 0x04)

const isFeedEntry = (name: string) => /\.(pb|pbf|bin)$/i.test(name)
const isNoise = (name: string) => name.endsWith('/') || name.startsWith('__MACOSX/') || /(^|\/)\./.test(name)

function unzipEntries(archive: UploadedFile, limits: ArchiveLimits, totalSoFar: { bytes: number }): CollectedFile[] {
  const out: CollectedFile[] = []
  let entries = 0
  let stopped = false
  const unzip = new Unzip((file: UnzipFile) => {
    const name = `${archive.name}/${file.name}`
    if (stopped || isNoise(file.name)) return
    if (!isFeedEntry(file.name)) { out.push({ name, skipped: 'not a .pb file' }); return }
    if (++entries > limits.maxEntries) {
      stopped = true
      out.push({ name: archive.name, error: { code: 'too_many_entries', message: `The archive holds more than ${limits.maxEntries} .pb files; split it.` } })
      return
    }
    const chunks: Uint8Array[] = []
    let size = 0
    let failed = false
    file.ondata = (err, chunk, final) => {
      if (failed) return
      if (err) {
        failed = true
        out.push({ name, error: { code: 'bad_archive', message: `The entry cannot be inflated (${err.message}).` } })
        return
      }
      size += chunk.length
      totalSoFar.bytes += chunk.length
      if (size > limits.maxEntryBytes || totalSoFar.bytes > limits.maxTotalBytes) {
        failed = true
        file.terminate()
        const cap = size > limits.maxEntryBytes ? `${limits.maxEntryBytes} bytes per file` : `${limits.maxTotalBytes} bytes in all`
        out.push({ name, error: { code: 'too_large', message: `The entry inflates to more than ${cap}.` } })
        if (totalSoFar.bytes > limits.maxTotalBytes) stopped = true
        return
      }
      chunks.push(chunk)
      if (final) out.push({ name, data: concat(chunks, size) })
    }
    file.start()
  })
  unzip.register(UnzipInflate)
  try {
    unzip.push(archive.data, true)
  } catch (err) {
    out.push({ name: archive.name, error: { code: 'bad_archive', message: `The zip archive cannot be read (${err instanceof Error ? err.message : String(err)}).` } })
  }
  if (entries === 0 && !out.some((f) => 'error' in f)) {
    out.push({ name: archive.name, error: { code: 'bad_archive', message: 'The zip archive holds no .pb files.' } })
  }
  return out
}

function concat(chunks: Uint8Array[], size: number): Uint8Array {
  if (chunks.length === 1) return chunks[0]
  const all = new Uint8Array(size)
  let at = 0
  for (const c of chunks) { all.set(c, at); at += c.length }
  return all
}

/** Expands zips, keeps bare files, and sorts by name so snapshots are read in time order when named by time. */
export function collectFiles(uploads: UploadedFile[], limits: ArchiveLimits = DEFAULT_ARCHIVE_LIMITS): CollectedFile[] {
  const total = { bytes: 0 }
  const out: CollectedFile[] = []
  for (const u of uploads) {
    if (isZip(u)) out.push(...unzipEntries(u, limits, total))
    else out.push({ name: u.name, data: u.data })
  }
  return out.sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0))
}
