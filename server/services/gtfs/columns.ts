import type { GtfsTable } from '../../db/tables/gtfs'

// Column order of the CSV lines each stage writes for COPY; the first is always feed_version_id.
export const COPY_COLUMNS: Record<GtfsTable, readonly string[]> = {
  gtfs_agency: ['feed_version_id', 'agency_id', 'agency_name', 'agency_url', 'agency_timezone', 'agency_lang', 'agency_phone', 'agency_fare_url', 'agency_email'],
  gtfs_stops: ['feed_version_id', 'stop_id', 'stop_code', 'stop_name', 'stop_desc', 'stop_lat', 'stop_lon', 'zone_id', 'stop_url', 'location_type', 'parent_station', 'stop_timezone', 'wheelchair_boarding', 'platform_code'],
  gtfs_routes: ['feed_version_id', 'route_id', 'agency_id', 'route_short_name', 'route_long_name', 'route_desc', 'route_type', 'route_url', 'route_color', 'route_text_color', 'route_sort_order'],
  gtfs_calendar: ['feed_version_id', 'service_id', 'monday', 'tuesday', 'wednesday', 'thursday', 'friday', 'saturday', 'sunday', 'start_date', 'end_date'],
  gtfs_calendar_dates: ['feed_version_id', 'service_id', 'date', 'exception_type'],
  gtfs_shapes: ['feed_version_id', 'shape_id', 'shape_pt_sequence', 'shape_pt_lat', 'shape_pt_lon', 'shape_dist_traveled', 'dist_m'],
  gtfs_trips: ['feed_version_id', 'trip_id', 'route_id', 'service_id', 'trip_headsign', 'trip_short_name', 'direction_id', 'block_id', 'shape_id', 'wheelchair_accessible', 'bikes_allowed'],
  gtfs_stop_times: ['feed_version_id', 'trip_id', 'stop_sequence', 'stop_id', 'arrival_time', 'departure_time', 'interpolated', 'stop_headsign', 'pickup_type', 'drop_off_type', 'timepoint', 'shape_dist_traveled', 'dist_m'],
  gtfs_frequencies: ['feed_version_id', 'trip_id', 'start_time', 'end_time', 'headway_secs', 'exact_times'],
  gtfs_feed_info: ['feed_version_id', 'feed_publisher_name', 'feed_publisher_url', 'feed_lang', 'default_lang', 'feed_start_date', 'feed_end_date', 'feed_version', 'feed_contact_email', 'feed_contact_url'],
  gtfs_service_dates: ['feed_version_id', 'service_id', 'date'],
  gtfs_frequency_trips: ['feed_version_id', 'trip_id', 'start_time', 'shift_s', 'headway_secs', 'exact_times'],
}
