// The whole Drizzle schema: one file per area under tables/, gathered here for drizzle-kit and the app.
export * from './tables/auth'
export * from './tables/outbox'
export * from './tables/jobs'
export * from './tables/signals'
export * from './tables/gtfs'
export * from './tables/realtime'
export * from './tables/corridors'
export * from './tables/proposals'
