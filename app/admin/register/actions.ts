'use server';

import { revalidatePath } from 'next/cache';
import { writeAudit } from '../../../lib/auth/audit';
import { getSharedPool } from '../../../lib/db/sharedPool';
import { guardAction } from '../../../lib/web/actionGuard';
import { getRegisterSnapshot } from '../../../lib/queries/registerSnapshot';
import { FleetFileError, readFleetFile } from '../../../lib/register/fleetFile';
import { importFleet } from '../../../lib/register/importFleet';
import { registerDiff, type RegisterDiff } from '../../../lib/web/registerDiff';
import { getSharedPrisma } from '../../../lib/web/sharedPrisma';

/**
 * Register import from the admin page, in two steps: "check" validates the
 * file (fleet-v1, every error by path) and shows what would change; "import"
 * validates again, compares again with the register as it is now, and runs
 * the same idempotent import as `holdfast fleet import` (one transaction).
 * Both steps need a fleet manager or an admin with a valid CSRF token
 * (lib/web/actionGuard.ts); an import is written to the audit log.
 */

export type RegisterState =
  | { phase: 'idle' }
  | { phase: 'invalid'; fileName: string; errors: string[] }
  | { phase: 'preview'; fileName: string; fileText: string; diff: RegisterDiff }
  | { phase: 'imported'; fileName: string; diff: RegisterDiff };

/** Above this a file is refused before parsing (a register of 500 vessels is about 0.6 MB). */
const MAX_FILE_BYTES = 4 * 1024 * 1024;

async function readUpload(form: FormData): Promise<{ fileName: string; text: string } | string> {
  const pasted = form.get('fileText');
  if (typeof pasted === 'string' && pasted.trim() !== '') {
    return { fileName: String(form.get('fileName') || 'fleet.json'), text: pasted };
  }
  const file = form.get('file');
  if (!(file instanceof File) || file.size === 0) return 'Choose a fleet register file (JSON or YAML).';
  if (file.size > MAX_FILE_BYTES) return `The file is ${(file.size / 1024 / 1024).toFixed(1)} MB; at most 4 MB.`;
  return { fileName: file.name || 'fleet.json', text: await file.text() };
}

export async function registerAction(_prev: RegisterState, form: FormData): Promise<RegisterState> {
  const gate = await guardAction(form, 'register.import');
  if (!gate.ok) return { phase: 'invalid', fileName: '', errors: [gate.message] };
  const upload = await readUpload(form);
  if (typeof upload === 'string') return { phase: 'invalid', fileName: '', errors: [upload] };
  let file;
  try {
    file = readFleetFile(upload.text, upload.fileName);
  } catch (error) {
    if (error instanceof FleetFileError) return { phase: 'invalid', fileName: upload.fileName, errors: error.errors };
    throw error;
  }
  const diff = registerDiff(await getRegisterSnapshot(getSharedPool()), file);
  if (form.get('intent') !== 'import') return { phase: 'preview', fileName: upload.fileName, fileText: upload.text, diff };
  await importFleet(getSharedPrisma(), file);
  await writeAudit(getSharedPool(), {
    actor: gate.principal,
    action: 'register.import',
    subject: upload.fileName,
    ip: gate.ip,
    detail: { vessels: file.vessels.length, campaigns: file.campaigns.length },
  });
  revalidatePath('/', 'layout');
  return { phase: 'imported', fileName: upload.fileName, diff };
}
