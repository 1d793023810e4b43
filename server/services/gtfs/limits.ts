// Caps that keep a hostile or broken upload from exhausting the server. Configurable per app
// (createApp({ gtfsLimits })) so tests can exercise them with small archives.
export interface GtfsLimits {
  /** Bytes of the uploaded zip itself. */
  maxUploadBytes: number
  /** Sum of the uncompressed sizes of every entry read, counted while inflating (zip bombs lie). */
  maxUncompressedBytes: number
  /** Entries in the archive's central directory. */
  maxEntries: number
  /** Findings kept in the report per kind; the totals are always exact. */
  maxFindingsPerKind: number
}

export const DEFAULT_GTFS_LIMITS: GtfsLimits = {
  maxUploadBytes: 512 * 1024 * 1024,
  maxUncompressedBytes: 4 * 1024 * 1024 * 1024,
  maxEntries: 200,
  maxFindingsPerKind: 50,
}
