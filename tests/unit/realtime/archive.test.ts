import { describe, expect, it } from 'vitest'
import { zipSync, strToU8 } from 'fflate'
import { collectFiles } from '../../../server/services/realtime/archive'

const names = (files: ReturnType<typeof collectFiles>) => files.map((f) => [f.name, 'data' in f ? f.data.length : 'skipped' in f ? 'skipped' : f.error.code])

describe('collectFiles', () => {
  it('keeps bare .pb files and expands zips (folders inside too), sorted by name', () => {
    const zip = zipSync({ 'b.pb': new Uint8Array(10), 'day/a.pb': new Uint8Array(20), 'notes.txt': strToU8('x'), '__MACOSX/._b.pb': new Uint8Array(3) })
    const got = collectFiles([{ name: 'z.pb', data: new Uint8Array(5) }, { name: 'snaps.zip', data: zip }])
    expect(names(got)).toEqual([
      ['snaps.zip/b.pb', 10],
      ['snaps.zip/day/a.pb', 20],
      ['snaps.zip/notes.txt', 'skipped'],
      ['z.pb', 5],
    ])
  })

  it('recognises a zip by its signature whatever its name', () => {
    const zip = zipSync({ 'a.pb': new Uint8Array(4) })
    expect(names(collectFiles([{ name: 'upload', data: zip }]))).toEqual([['upload/a.pb', 4]])
  })

  it('caps the bytes actually inflated per entry and in all', () => {
    // 5 MB of zeros compress to a few kB: the cap must count inflated bytes, not the upload size.
    const zip = zipSync({ 'big.pb': new Uint8Array(5_000_000), 'small.pb': new Uint8Array(100) })
    expect(zip.length).toBeLessThan(100_000)
    expect(names(collectFiles([{ name: 'bomb.zip', data: zip }], { maxEntries: 10, maxEntryBytes: 1_000_000, maxTotalBytes: 1e9 })))
      .toEqual([['bomb.zip/big.pb', 'too_large'], ['bomb.zip/small.pb', 100]])
    const twice = zipSync({ 'a.pb': new Uint8Array(600), 'b.pb': new Uint8Array(600) })
    expect(names(collectFiles([{ name: 't.zip', data: twice }], { maxEntries: 10, maxEntryBytes: 1000, maxTotalBytes: 1000 })))
      .toEqual([['t.zip/a.pb', 600], ['t.zip/b.pb', 'too_large']])
  })

  it('caps the number of entries', () => {
    const zip = zipSync({ '1.pb': new Uint8Array(1), '2.pb': new Uint8Array(1), '3.pb': new Uint8Array(1) })
    const got = collectFiles([{ name: 'many.zip', data: zip }], { maxEntries: 2, maxEntryBytes: 1e6, maxTotalBytes: 1e9 })
    expect(names(got)).toContainEqual(['many.zip', 'too_many_entries'])
  })

  it('names a broken or empty archive', () => {
    const zip = zipSync({ 'a.pb': new Uint8Array(300).map((_, i) => i), 'b.pb': new Uint8Array(300).map((_, i) => 255 - i) })
    expect(names(collectFiles([{ name: 'cut.zip', data: zip.subarray(0, zip.length - 150) }]))).toContainEqual(['cut.zip', 'bad_archive'])
    expect(names(collectFiles([{ name: 'empty.zip', data: zipSync({ 'readme.txt': strToU8('hi') }) }]))).toEqual([
      ['empty.zip', 'bad_archive'],
      ['empty.zip/readme.txt', 'skipped'],
    ])
  })
})
