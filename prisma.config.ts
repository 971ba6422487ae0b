import { defineConfig } from 'prisma/config';

// Prisma is used for its client only: migrations are SQL files applied by
// lib/db/migrate.ts, because `prisma migrate` needs a download this
// environment cannot make. The URL is only needed by Prisma CLI commands
// that talk to a database (none are part of the normal workflow).
export default defineConfig({
  schema: 'prisma/schema.prisma',
  datasource: { url: process.env.DATABASE_URL ?? 'postgres://localhost/holdfast' },
});
