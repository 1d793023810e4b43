import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { zipSync, strToU8 } from 'fflate'
import { ArchiveError, openZip, readEntry } from '../../../server/services/gtfs/zip'

let dir: string
beforeAll(() => { dir = mkdtempSync(path.join(tmpdir(), 'fanlight-zip-')) })
afterAll(() => { rmSync(dir, { recursive: true, force: true }) })

const limits = { maxEntries: 10, maxUncompressedBytes: 1_000_000 }
let n = 0
function file(bytes: Uint8Array | string): string {
  const p = path.join(dir, `${n++}.zip`)
  writeFileSync(p, bytes)
  return p
}
async function text(p: string, name: string, max = 1_000_000) {
  const zip = await openZip(p, { ...limits, maxUncompressedBytes: max })
  const entry = zip.entries.find((e) => e.name === name)!
  const parts: Buffer[] = []
  for await (const c of readEntry(zip, entry, { used: 0, max })) parts.push(Buffer.from(c))
  return Buffer.concat(parts).toString('utf8')
}
const kindOf = (p: Promise<unknown>) => p.then(() => 'ok', (e) => (e instanceof ArchiveError ? e.kind : String(e)))

describe('zip reading', () => {
  it('lists entries and streams stored and deflated ones', async () => {
    const big = 'x,y\n'.repeat(50_000)
    const p = file(zipSync({ 'a.txt': [strToU8('hello'), { level: 0 }], 'b.txt': strToU8(big), 'dir/': new Uint8Array(0) }))
    const zip = await openZip(p, limits)
    expect(zip.entries.map((e) => [e.name, e.method])).toEqual([['a.txt', 0], ['b.txt', 8]])
    expect(await text(p, 'a.txt')).toBe('hello')
    expect(await text(p, 'b.txt')).toBe(big)
  })

  it('refuses a file that is not a zip', async () => {
    expect(await kindOf(openZip(file('stop_id,stop_name\nS1,Main\n'), limits))).toBe('not_a_zip')
  })

  it('refuses entries whose path leaves the archive', async () => {
    for (const name of ['../agency.txt', 'gtfs/../../stops.txt', '/etc/passwd', 'C:/feed/agency.txt', '..\\routes.txt']) {
      expect(await kindOf(openZip(file(zipSync({ [name]: strToU8('x') })), limits)), name).toBe('path_outside_archive')
    }
  })

  it('caps the number of entries', async () => {
    const many = Object.fromEntries(Array.from({ length: 11 }, (_, i) => [`f${i}.txt`, strToU8('x')]))
    expect(await kindOf(openZip(file(zipSync(many)), limits))).toBe('too_many_entries')
  })

  it('caps the declared uncompressed size', async () => {
    const p = file(zipSync({ 'stop_times.txt': new Uint8Array(2_000_000) }))
    expect(await kindOf(openZip(p, limits))).toBe('too_large')
  })

  it('catches an entry that inflates past the size it declares (a lying bomb)', async () => {
    const bytes = zipSync({ 'stop_times.txt': new Uint8Array(5_000_000) })
    // Rewrite the declared size, in the local header and the central directory, to 100 bytes.
    const buf = Buffer.from(bytes)
    buf.writeUInt32LE(100, 22)
    const cd = buf.lastIndexOf(Buffer.from([0x50, 0x4b, 0x01, 0x02]))
    buf.writeUInt32LE(100, cd + 24)
    const p = file(buf)
    const zip = await openZip(p, { ...limits, maxUncompressedBytes: 10_000_000 })
    expect(zip.entries[0].size).toBe(100)
    expect(await kindOf(text(p, 'stop_times.txt', 10_000_000))).toBe('size_mismatch')
  })

  it('stops inflating once the whole budget is spent', async () => {
    const p = file(zipSync({ 'a.txt': new Uint8Array(600_000), 'b.txt': new Uint8Array(600_000) }))
    const zip = await openZip(p, { maxEntries: 10, maxUncompressedBytes: 2_000_000 })
    const budget = { used: 0, max: 1_000_000 }
    const drain = async (name: string) => { for await (const _ of readEntry(zip, zip.entries.find((e) => e.name === name)!, budget)) void _ }
    await drain('a.txt')
    expect(await kindOf(drain('b.txt'))).toBe('too_large')
  })
})
