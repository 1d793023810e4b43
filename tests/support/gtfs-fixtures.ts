// A small, valid GTFS feed (invented, for tests only) and helpers to break it one way at a time.
import { zipSync, strToU8 } from 'fflate'

export type FeedFiles = Record<string, string>

export function minimalFeed(): FeedFiles {
  return {
    'agency.txt': 'agency_id,agency_name,agency_url,agency_timezone\nTA,Test Agency,https://agency.test/,Europe/Zurich\n',
    'stops.txt': [
      'stop_id,stop_name,stop_lat,stop_lon',
      'S1,First Stop,47.6000,8.9000',
      'S2,Second Stop,47.6000,8.9100',
      'S3,Third Stop,47.6000,8.9200',
      'S4,Fourth Stop,47.6000,8.9300',
    ].join('\n') + '\n',
    'routes.txt': 'route_id,agency_id,route_short_name,route_long_name,route_type\nR1,TA,1,Test Line,3\n',
    'calendar.txt': 'service_id,monday,tuesday,wednesday,thursday,friday,saturday,sunday,start_date,end_date\nWK,1,1,1,1,1,0,0,20260105,20260116\n',
    'calendar_dates.txt': 'service_id,date,exception_type\nWK,20260107,2\nWK,20260110,1\n',
    'shapes.txt': [
      'shape_id,shape_pt_lat,shape_pt_lon,shape_pt_sequence',
      'SH1,47.6000,8.9000,1',
      'SH1,47.6000,8.9100,2',
      'SH1,47.6000,8.9200,3',
      'SH1,47.6000,8.9300,4',
    ].join('\n') + '\n',
    'trips.txt': 'route_id,service_id,trip_id,direction_id,shape_id\nR1,WK,T1,0,SH1\nR1,WK,T2,0,SH1\n',
    'stop_times.txt': [
      'trip_id,arrival_time,departure_time,stop_id,stop_sequence,timepoint',
      'T1,08:00:00,08:00:00,S1,1,1',
      'T1,,,S2,2,0',
      'T1,,,S3,3,0',
      'T1,08:09:00,08:09:00,S4,4,1',
      'T2,24:50:00,24:50:00,S1,1,1',
      'T2,24:53:00,24:53:00,S2,2,1',
      'T2,24:56:00,24:56:00,S3,3,1',
      'T2,25:00:00,25:00:00,S4,4,1',
    ].join('\n') + '\n',
    'frequencies.txt': 'trip_id,start_time,end_time,headway_secs,exact_times\nT1,18:00:00,19:00:00,1200,1\n',
  }
}

export function zipFeed(files: FeedFiles): Buffer {
  const entries = Object.fromEntries(Object.entries(files).map(([name, text]) => [name, strToU8(text)]))
  return Buffer.from(zipSync(entries, { level: 6, mtime: new Date('2026-01-01T00:00:00Z') }))
}
