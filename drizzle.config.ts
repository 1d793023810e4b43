import { defineConfig } from 'drizzle-kit'

// Migrations are generated from the schema (`npm run db:generate`) and applied at start.
export default defineConfig({
  dialect: 'postgresql',
  schema: './server/db/schema.ts',
  out: './drizzle',
})
