// The holdfast CLI as plain JavaScript, for `holdfast ingest`.
//
// Why: under tsx every module is transformed on the fly by a loader that
// runs on a thread of its own, with its own heap, and keeps source maps of
// everything it loaded; that costs the long-running ingest worker about
// 25 MB of resident memory for nothing once it has started (README, "Ingest
// speed"). So the worker runs from an esbuild bundle of cli/main.ts built at
// start: about half a second, with the esbuild that tsx itself uses.
//
// - Code splitting keeps each command's modules in chunks of their own, loaded
//   only when the command runs (as cli/main.ts intends); packages stay
//   imports, resolved from the project's node_modules.
// - `import.meta.url` is pinned to each source file's own URL, so paths
//   found from it (prisma/migrations, the generated Prisma client) stay
//   right wherever the bundle lives.
// - The bundle goes to node_modules/.cache/holdfast-cli/<content hash>/,
//   written to a temporary folder and renamed, so workers starting together
//   share it without reading a half-written one. Folders unused for a day
//   are removed.
// - When anything fails, the caller falls back to tsx (and says why).
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readdirSync, readFileSync, renameSync, rmSync, statSync, utimesSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const CACHE = path.join(ROOT, 'node_modules', '.cache', 'holdfast-cli');
const STALE_MS = 24 * 3600_000;

/** esbuild as tsx resolves it: tsx depends on it, the project does only through tsx. */
function loadEsbuild() {
  const tsx = createRequire(import.meta.url).resolve('tsx/package.json');
  return createRequire(tsx)('esbuild');
}

/** Replace `import.meta.url` in the project's TypeScript with the file's own URL. */
const pinImportMetaUrl = {
  name: 'pin-import-meta-url',
  setup(build) {
    build.onLoad({ filter: /\.[cm]?tsx?$/ }, (args) => {
      if (args.path.includes(`${path.sep}node_modules${path.sep}`)) return undefined;
      const source = readFileSync(args.path, 'utf8');
      if (!source.includes('import.meta.url')) return undefined;
      const contents = source.replaceAll('import.meta.url', JSON.stringify(pathToFileURL(args.path).href));
      return { contents, loader: args.path.endsWith('x') ? 'tsx' : 'ts' };
    });
  },
};

/** Build (or find) the bundle; the URL of its entry module. */
export async function bundledCli() {
  const esbuild = loadEsbuild();
  let result;
  try {
    result = await esbuild.build({
      absWorkingDir: ROOT,
      entryPoints: { main: 'cli/main.ts' },
      bundle: true,
      splitting: true,
      format: 'esm',
      platform: 'node',
      target: 'node20',
      packages: 'external',
      // No keepNames: it names every closure when it is created, which cost the worker
      // about 5 % of its CPU; esbuild renames only on clashes (three functions, no class).
      outdir: CACHE,
      chunkNames: 'chunk-[hash]',
      write: false,
      logLevel: 'silent',
      plugins: [pinImportMetaUrl],
    });
  } finally {
    await esbuild.stop?.(); // the esbuild service process is not needed any more
  }
  const files = [...result.outputFiles].sort((a, b) => a.path.localeCompare(b.path));
  const hash = createHash('sha256');
  for (const f of files) hash.update(path.relative(CACHE, f.path)).update('\0').update(f.contents);
  const dir = path.join(CACHE, hash.digest('hex').slice(0, 16));
  if (!existsSync(path.join(dir, 'main.js'))) {
    const temporary = `${dir}.tmp-${process.pid}`;
    rmSync(temporary, { recursive: true, force: true });
    mkdirSync(temporary, { recursive: true });
    for (const f of files) {
      const target = path.join(temporary, path.relative(CACHE, f.path));
      mkdirSync(path.dirname(target), { recursive: true });
      writeFileSync(target, f.contents);
    }
    try {
      renameSync(temporary, dir);
    } catch (error) {
      // Another process renamed the same content first.
      rmSync(temporary, { recursive: true, force: true });
      if (!existsSync(path.join(dir, 'main.js'))) throw error;
    }
  }
  const now = new Date();
  utimesSync(dir, now, now);
  removeStale(dir);
  return pathToFileURL(path.join(dir, 'main.js')).href;
}

function removeStale(keep) {
  for (const name of readdirSync(CACHE)) {
    const dir = path.join(CACHE, name);
    try {
      if (dir !== keep && Date.now() - statSync(dir).mtimeMs > STALE_MS) rmSync(dir, { recursive: true, force: true });
    } catch {
      // removed by another process meanwhile
    }
  }
}
