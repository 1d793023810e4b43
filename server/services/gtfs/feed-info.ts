// feed_info.txt: one row about the feed itself.
import { parseGtfsDate } from '../../../shared/gtfs/date'
import type { FeedState } from './feed-state'
import { readGtfsFile, type ReadContext, type ReadOutcome } from './read-file'
import type { ZipEntry } from './zip'

export async function readFeedInfo(st: FeedState, ctx: ReadContext, entry: ZipEntry): Promise<ReadOutcome> {
  const file = 'feed_info.txt'
  const w = st.writers.gtfs_feed_info
  const day = (s: string) => (s === '' ? null : parseGtfsDate(s))
  return readGtfsFile(ctx, file, entry, (r, line) => {
    if (w.rows > 0) {
      st.findings.warning('feed_info_rows', { file, line, field: null, value: null, message: 'feed_info.txt has more than one row; only the first is kept.' })
      return
    }
    if (r.feed_start_date !== '' && r.feed_end_date !== '' && r.feed_end_date < r.feed_start_date) {
      st.findings.error('date_order', { file, line, field: 'feed_end_date', value: r.feed_end_date, message: `feed_end_date is before feed_start_date ${r.feed_start_date}.` })
      return
    }
    w.row(10).int(st.feedId).text(r.feed_publisher_name).text(r.feed_publisher_url).text(r.feed_lang).text(r.default_lang)
      .date(day(r.feed_start_date)).date(day(r.feed_end_date)).text(r.feed_version).text(r.feed_contact_email).text(r.feed_contact_url)
  })
}
