// Generates the Prisma client into lib/db/generated after `npm install`.
// Prisma 7's client needs no engine binary, but `prisma generate` still looks
// for the schema engine; offline it cannot download one, and any existing
// file satisfies the check (the engine is never run by `generate`).
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

const env = { ...process.env, PRISMA_HIDE_UPDATE_MESSAGE: '1', CHECKPOINT_DISABLE: '1' };
env.PRISMA_SCHEMA_ENGINE_BINARY ??= fileURLToPath(import.meta.url);
const result = spawnSync(process.execPath, ['node_modules/prisma/build/index.js', 'generate'], {
  stdio: 'inherit',
  env,
});
process.exit(result.status ?? 1);
