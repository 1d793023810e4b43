// Reads a zip archive from disk without unpacking it: the central directory gives every entry's
// place, so each GTFS file can be streamed (inflated chunk by chunk with fflate) in the order the
// checks need, whatever the order inside the archive. Nothing is ever written to disk, and
// entries whose path would leave the archive, encrypted entries and zip bombs are refused.
import { open } from 'node:fs/promises'
import { createReadStream } from 'node:fs'
import { Inflate } from 'fflate'

export class ArchiveError extends Error {
  constructor(readonly kind: string, message: string, readonly entry: string | null = null) {
    super(message)
  }
}

export interface ZipEntry {
  name: string
  method: number
  flags: number
  compressedSize: number
  /** As declared by the archive; the bytes actually inflated are counted too. */
  size: number
  localOffset: number
}

export interface ZipArchive {
  path: string
  entries: ZipEntry[]
}

export interface InflateBudget {
  used: number
  max: number
}

const EOCD = 0x06054b50
const CENTRAL = 0x02014b50
const LOCAL = 0x04034b50
const SLICE = 16 * 1024

/** Lists the entries of the zip at `path`, refusing what cannot be read safely. */
export async function openZip(path: string, limits: { maxEntries: number; maxUncompressedBytes: number }): Promise<ZipArchive> {
  const fh = await open(path, 'r')
  try {
    const { size } = await fh.stat()
    // The end record is the last 22 bytes plus a comment of up to 65 535 bytes.
    const tailLength = Math.min(size, 22 + 65_535)
    const tail = Buffer.alloc(tailLength)
    await fh.read(tail, 0, tailLength, size - tailLength)
    let eocd = -1
    for (let i = tailLength - 22; i >= 0; i--) {
      if (tail.readUInt32LE(i) === EOCD) { eocd = i; break }
    }
    if (eocd < 0) throw new ArchiveError('not_a_zip', 'The upload is not a zip archive (no zip end record found). A GTFS feed is a .zip of .txt files.')
    const count = tail.readUInt16LE(eocd + 10)
    const cdSize = tail.readUInt32LE(eocd + 12)
    const cdOffset = tail.readUInt32LE(eocd + 16)
    if (count === 0xffff || cdSize === 0xffffffff || cdOffset === 0xffffffff) {
      throw new ArchiveError('zip64', 'ZIP64 archives are not supported; a GTFS feed this large exceeds the import limits.')
    }
    if (count > limits.maxEntries) {
      throw new ArchiveError('too_many_entries', `The archive has ${count} entries; at most ${limits.maxEntries} are accepted.`)
    }
    if (cdOffset + cdSize > size) throw new ArchiveError('corrupt_zip', 'The zip archive is truncated or corrupt (its directory lies past the end of the file).')
    const cd = Buffer.alloc(cdSize)
    await fh.read(cd, 0, cdSize, cdOffset)
    const entries: ZipEntry[] = []
    let p = 0
    let declared = 0
    for (let i = 0; i < count; i++) {
      if (p + 46 > cdSize || cd.readUInt32LE(p) !== CENTRAL) throw new ArchiveError('corrupt_zip', 'The zip archive is corrupt (bad central directory).')
      const flags = cd.readUInt16LE(p + 8)
      const method = cd.readUInt16LE(p + 10)
      const compressedSize = cd.readUInt32LE(p + 20)
      const uncompressed = cd.readUInt32LE(p + 24)
      const nameLength = cd.readUInt16LE(p + 28)
      const extraLength = cd.readUInt16LE(p + 30)
      const commentLength = cd.readUInt16LE(p + 32)
      const localOffset = cd.readUInt32LE(p + 42)
      const raw = cd.subarray(p + 46, p + 46 + nameLength)
      // Bit 11: the name is UTF-8; otherwise code page 437, read as Latin-1 (GTFS names are ASCII).
      const name = raw.toString(flags & 0x800 ? 'utf8' : 'latin1')
      p += 46 + nameLength + extraLength + commentLength
      checkPath(name)
      if (name.endsWith('/')) continue
      if (flags & 0x1) throw new ArchiveError('encrypted', `The entry ${name} is encrypted; upload an archive without a password.`, name)
      if (method !== 0 && method !== 8) throw new ArchiveError('compression', `The entry ${name} uses compression method ${method}; only stored and deflate entries are read.`, name)
      declared += uncompressed
      entries.push({ name, method, flags, compressedSize, size: uncompressed, localOffset })
    }
    if (declared > limits.maxUncompressedBytes) {
      throw new ArchiveError('too_large', `The archive declares ${declared} bytes once uncompressed; at most ${limits.maxUncompressedBytes} are accepted.`)
    }
    return { path, entries }
  } finally {
    await fh.close()
  }
}

/** Absolute paths, drive letters and ".." segments could point outside the archive when unpacked. */
function checkPath(name: string) {
  const n = name.replaceAll('\\', '/')
  if (n.startsWith('/') || /^[A-Za-z]:/.test(n) || n.split('/').includes('..') || n.includes('\0')) {
    throw new ArchiveError('path_outside_archive', `The entry "${name}" has a path outside the archive; such archives are refused.`, name)
  }
}

/**
 * The bytes of one entry, inflated as they are read. Every byte counts against the shared budget,
 * and an entry that inflates past its declared size is refused: the declared sizes were checked
 * against the limits, so a lie is a bomb.
 */
export async function* readEntry(zip: ZipArchive, entry: ZipEntry, budget: InflateBudget): AsyncGenerator<Uint8Array> {
  const fh = await open(zip.path, 'r')
  let dataStart: number
  try {
    const header = Buffer.alloc(30)
    await fh.read(header, 0, 30, entry.localOffset)
    if (header.readUInt32LE(0) !== LOCAL) throw new ArchiveError('corrupt_zip', `The zip archive is corrupt (no local header for ${entry.name}).`, entry.name)
    dataStart = entry.localOffset + 30 + header.readUInt16LE(26) + header.readUInt16LE(28)
  } finally {
    await fh.close()
  }
  if (entry.compressedSize === 0) return
  let produced = 0
  const count = (chunk: Uint8Array) => {
    produced += chunk.length
    budget.used += chunk.length
    if (produced > entry.size) {
      throw new ArchiveError('size_mismatch', `The entry ${entry.name} inflates to more than the ${entry.size} bytes it declares; the archive is refused as a possible zip bomb.`, entry.name)
    }
    if (budget.used > budget.max) {
      throw new ArchiveError('too_large', `The archive inflates to more than ${budget.max} bytes; the import stops there.`, entry.name)
    }
  }
  const input = createReadStream(zip.path, { start: dataStart, end: dataStart + entry.compressedSize - 1, highWaterMark: 256 * 1024 })
  try {
    if (entry.method === 0) {
      for await (const chunk of input) { count(chunk as Buffer); yield chunk as Buffer }
      return
    }
    const out: Uint8Array[] = []
    const inflater = new Inflate((chunk) => { out.push(chunk) })
    const push = (chunk: Uint8Array, final: boolean) => {
      try {
        inflater.push(chunk, final)
      } catch (err) {
        throw new ArchiveError('corrupt_zip', `The entry ${entry.name} cannot be inflated (${(err as Error).message}).`, entry.name)
      }
    }
    for await (const chunk of input) {
      // Fed in small slices so that a bomb is caught after a few megabytes, not one giant chunk.
      const buf = chunk as Buffer
      for (let i = 0; i < buf.length; i += SLICE) {
        push(buf.subarray(i, i + SLICE), false)
        while (out.length) { const c = out.shift()!; count(c); yield c }
      }
    }
    push(new Uint8Array(0), true)
    while (out.length) { const c = out.shift()!; count(c); yield c }
  } finally {
    input.destroy()
  }
}
