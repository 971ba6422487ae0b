import { mkdir, rename, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { writeAudit, type AuditActor } from '../auth/audit';
import type { Queryable } from '../auth/db';
import { listLiveCredentials } from './credentials';
import { aclFileText, configSnippetText, passwordFileText } from './mosquittoFiles';

/**
 * Writes the Mosquitto files of the live credentials into `dir`: `passwd`,
 * `acl` and `holdfast.conf` (the snippet that points at them). Each file is
 * written to a temporary name and renamed into place, so a Mosquitto that
 * reloads (SIGHUP) meanwhile reads the old file or the new one, never half
 * of one. The password file holds hashes only; it is still made readable by
 * its owner only (0600), as mosquitto_passwd does.
 */

export interface ExportSummary {
  dir: string;
  passwordFile: string;
  aclFile: string;
  configFile: string;
  vessels: number;
  ingest: number;
}

async function writeAtomically(file: string, text: string, mode: number) {
  const temporary = `${file}.${process.pid}.tmp`;
  await writeFile(temporary, text, { mode });
  await rename(temporary, file);
}

export async function exportMosquittoFiles(db: Queryable, dir: string, topicRoot: string, actor: AuditActor): Promise<ExportSummary> {
  const credentials = await listLiveCredentials(db);
  const target = path.resolve(dir);
  await mkdir(target, { recursive: true });
  const passwordFile = path.join(target, 'passwd');
  const aclFile = path.join(target, 'acl');
  const configFile = path.join(target, 'holdfast.conf');
  // Render everything before writing anything: a refused name leaves the old files alone.
  const texts = {
    passwd: passwordFileText(credentials),
    acl: aclFileText(credentials, topicRoot),
    conf: configSnippetText(passwordFile, aclFile),
  };
  await writeAtomically(passwordFile, texts.passwd, 0o600);
  await writeAtomically(aclFile, texts.acl, 0o644);
  await writeAtomically(configFile, texts.conf, 0o644);
  const vessels = credentials.filter((c) => c.kind === 'vessel').length;
  const ingest = credentials.length - vessels;
  await writeAudit(db, { actor, action: 'broker.export', subject: target, detail: { vessels, ingest, topicRoot } });
  return { dir: target, passwordFile, aclFile, configFile, vessels, ingest };
}
