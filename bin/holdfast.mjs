#!/usr/bin/env node
// The holdfast command: runs the TypeScript CLI through tsx's loader.
import { register } from 'tsx/esm/api';

process.env.NEXT_TELEMETRY_DISABLED ??= '1';
register();
await import('../cli/main.ts');
