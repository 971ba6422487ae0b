#!/usr/bin/env node
// The holdfast command: runs the TypeScript CLI through tsx's loader, except
// `holdfast ingest`, which runs from a bundle built at start (less memory for
// the long-running worker; ingest/bundle.mjs says why and how).
process.env.NEXT_TELEMETRY_DISABLED ??= '1';
const bundle = process.argv[2] === 'ingest' ? await import('../ingest/bundle.mjs').then((b) => b.bundledCli()).catch((error) => {
  process.emitWarning(`running under tsx: the ingest bundle could not be built (${error.message})`);
}) : undefined;
if (bundle) {
  await import(bundle);
} else {
  const { register } = await import('tsx/esm/api');
  register();
  await import('../cli/main.ts');
}
