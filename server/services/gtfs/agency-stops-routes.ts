// agency.txt, stops.txt and routes.txt: the files every later file refers to.
import type { FeedState } from './feed-state'
import { readGtfsFile, type ReadContext, type ReadOutcome } from './read-file'
import type { ZipEntry } from './zip'

export async function readAgency(st: FeedState, ctx: ReadContext, entry: ZipEntry): Promise<ReadOutcome> {
  const file = 'agency.txt'
  // A handful of rows: whether agency_id may be blank depends on how many there are.
  const rows: { r: import('./read-file').RowOf<'agency.txt'>; line: number }[] = []
  const out = await readGtfsFile(ctx, file, entry, (r, line) => { rows.push({ r, line }) })
  const w = st.writers.gtfs_agency
  for (const { r, line } of rows) {
    if (r.agency_id === '' && rows.length > 1) {
      st.findings.error('conditional_field', { file, line, field: 'agency_id', value: '', message: 'agency_id is required when the feed has more than one agency.' })
      continue
    }
    if (st.agencyIds.has(r.agency_id)) {
      st.findings.error('duplicate_key', { file, line, field: 'agency_id', value: r.agency_id, message: `The agency_id ${r.agency_id} is defined twice.` })
      continue
    }
    st.agencyIds.add(r.agency_id)
    st.agencyTimezones.add(r.agency_timezone)
    w.row(9).int(st.feedId).text(r.agency_id, true).text(r.agency_name).text(r.agency_url).text(r.agency_timezone)
      .text(r.agency_lang).text(r.agency_phone).text(r.agency_fare_url).text(r.agency_email)
  }
  if (st.agencyTimezones.size > 1) {
    st.findings.warning('agency_timezone', { file, line: null, field: 'agency_timezone', value: [...st.agencyTimezones].join(', '), message: 'All agencies of a feed should use the same time zone.' })
  }
  return out
}

export async function readStops(st: FeedState, ctx: ReadContext, entry: ZipEntry): Promise<ReadOutcome> {
  const file = 'stops.txt'
  const w = st.writers.gtfs_stops
  const f = st.findings
  const out = await readGtfsFile(ctx, file, entry, (r, line) => {
    if (st.stopIndex.has(r.stop_id)) {
      f.error('duplicate_key', { file, line, field: 'stop_id', value: r.stop_id, message: `The stop_id ${r.stop_id} is defined twice.` })
      return
    }
    const type = r.location_type === '' ? 0 : Number(r.location_type)
    // Stops, stations and entrances must be placed and named; generic nodes and boarding areas may not be.
    if (type <= 2) {
      for (const field of ['stop_lat', 'stop_lon', 'stop_name'] as const) {
        if (r[field] === '') f.error('conditional_field', { file, line, field, value: '', message: `${field} is required for location_type ${type}.` })
      }
      if (r.stop_lat === '' || r.stop_lon === '' || r.stop_name === '') return
    }
    if (type >= 2 && r.parent_station === '') {
      f.error('conditional_field', { file, line, field: 'parent_station', value: '', message: `parent_station is required for location_type ${type}.` })
      return
    }
    if (type === 1 && r.parent_station !== '') {
      f.warning('conditional_field', { file, line, field: 'parent_station', value: r.parent_station, message: 'A station (location_type 1) cannot have a parent_station; it is ignored.' })
    }
    const i = st.stopIds.length
    st.stopIndex.set(r.stop_id, i)
    st.stopIds.push(r.stop_id)
    st.stopBytes.push(Buffer.from(r.stop_id))
    st.stopLat.push(r.stop_lat === '' ? NaN : Number(r.stop_lat))
    st.stopLon.push(r.stop_lon === '' ? NaN : Number(r.stop_lon))
    st.stopType.push(type)
    const parent = type === 1 ? '' : r.parent_station
    if (parent !== '') st.parentOf.push({ stop: i, parent, line })
    w.row(14).int(st.feedId).text(r.stop_id).text(r.stop_code).text(r.stop_name).text(r.stop_desc)
      .float(st.stopLat[i]).float(st.stopLon[i]).text(r.zone_id).text(r.stop_url).small(type).text(parent)
      .text(r.stop_timezone).small(r.wheelchair_boarding === '' ? null : Number(r.wheelchair_boarding)).text(r.platform_code)
  })
  st.stopUsed = new Uint8Array(st.stopIds.length)
  for (const p of st.parentOf) {
    const parent = st.stopIndex.get(p.parent)
    if (parent === undefined) {
      f.error('dangling_reference', { file, line: p.line, field: 'parent_station', value: p.parent, message: `No stop has the stop_id ${p.parent}.` })
      continue
    }
    st.stopUsed[parent] = 1
    const type = st.stopType[p.stop], ptype = st.stopType[parent]
    // Platforms and entrances hang from stations; generic nodes too; boarding areas from platforms.
    const expected = type === 4 ? 0 : 1
    if (ptype !== expected) {
      f.warning('parent_type', { file, line: p.line, field: 'parent_station', value: p.parent, message: `The parent of a location_type ${type} should have location_type ${expected}, not ${ptype}.` })
    }
  }
  return out
}

export async function readRoutes(st: FeedState, ctx: ReadContext, entry: ZipEntry): Promise<ReadOutcome> {
  const file = 'routes.txt'
  const w = st.writers.gtfs_routes
  const f = st.findings
  const single = st.agencyIds.size === 1 ? [...st.agencyIds][0] : null
  return readGtfsFile(ctx, file, entry, (r, line) => {
    if (st.routeIndex.has(r.route_id)) {
      f.error('duplicate_key', { file, line, field: 'route_id', value: r.route_id, message: `The route_id ${r.route_id} is defined twice.` })
      return
    }
    let agency = r.agency_id
    if (agency === '') {
      if (single === null) {
        f.error('conditional_field', { file, line, field: 'agency_id', value: '', message: 'agency_id is required when the feed has more than one agency.' })
        return
      }
      agency = single
    } else if (!st.agencyIds.has(agency)) {
      f.error('dangling_reference', { file, line, field: 'agency_id', value: agency, message: `No agency in agency.txt has the agency_id ${agency}.` })
      return
    }
    if (r.route_short_name === '' && r.route_long_name === '') {
      f.error('conditional_field', { file, line, field: 'route_short_name', value: '', message: 'Give route_short_name or route_long_name (or both).' })
      return
    }
    st.routeIndex.set(r.route_id, st.routeUsed.length)
    st.routeUsed.push(false)
    w.row(11).int(st.feedId).text(r.route_id).text(agency, true).text(r.route_short_name).text(r.route_long_name).text(r.route_desc)
      .int(Number(r.route_type)).text(r.route_url).text(r.route_color.toUpperCase()).text(r.route_text_color.toUpperCase())
      .int(r.route_sort_order === '' ? null : Number(r.route_sort_order))
  })
}
