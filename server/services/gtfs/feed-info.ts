// feed_info.txt: one row about the feed itself.
import { isoDate, parseGtfsDate } from '../../../shared/gtfs/date'
import type { FeedState } from './feed-state'
import { readGtfsFile, type ReadContext, type ReadOutcome } from './read-file'
import type { ZipEntry } from './zip'
import { csv } from './writer'

export async function readFeedInfo(st: FeedState, ctx: ReadContext, entry: ZipEntry): Promise<ReadOutcome> {
  const file = 'feed_info.txt'
  const w = st.writers.gtfs_feed_info
  const iso = (s: string) => (s === '' ? '' : isoDate(parseGtfsDate(s)!))
  return readGtfsFile(ctx, file, entry, (r, line) => {
    if (w.rows > 0) {
      st.findings.warning('feed_info_rows', { file, line, field: null, value: null, message: 'feed_info.txt has more than one row; only the first is kept.' })
      return
    }
    if (r.feed_start_date !== '' && r.feed_end_date !== '' && r.feed_end_date < r.feed_start_date) {
      st.findings.error('date_order', { file, line, field: 'feed_end_date', value: r.feed_end_date, message: `feed_end_date is before feed_start_date ${r.feed_start_date}.` })
      return
    }
    w.line(`${st.feedId},${csv(r.feed_publisher_name)},${csv(r.feed_publisher_url)},${csv(r.feed_lang)},${csv(r.default_lang)},${iso(r.feed_start_date)},${iso(r.feed_end_date)},${csv(r.feed_version)},${csv(r.feed_contact_email)},${csv(r.feed_contact_url)}`)
  })
}
