import type { LiveCredential } from './credentials';

/**
 * The text of the files `holdfast broker export` writes for Mosquitto 2.
 *
 * Password file (mosquitto_passwd(1), mosquitto.conf(5) `password_file`):
 * one `username:hash` line per user; the hashes are stored in Mosquitto's
 * own `$7$` format already (passwordHash.ts), so they are written as they are.
 *
 * ACL file (mosquitto.conf(5) `acl_file`; mosquitto.org/documentation,
 * "acl file"): after `user <username>`, lines `topic [read|write|readwrite]
 * <topic>` grant that user access; "If this parameter is defined then only
 * the topics listed will have access". So each vessel gets
 * `topic write {root}/{key}/+` and nothing else (not even reading its own
 * topic), and the ingest worker `topic read {root}/+/+`. No lines come
 * before the first `user` line, so anonymous clients get nothing; the
 * configuration snippet also turns anonymous access off.
 *
 * The output is sorted and holds no time stamp, so exporting an unchanged
 * register gives identical files (easy to diff and to manage as config).
 */

/** Usernames and topics are written into line-based files: refuse anything that could break a line apart. */
const SAFE_USERNAME = /^[A-Za-z0-9_-]{1,64}$/;
const SAFE_ROOT = /^[^\s#+:]+$/;

export class ExportInputError extends Error {}

function checkUsername(username: string) {
  if (!SAFE_USERNAME.test(username)) throw new ExportInputError(`username "${username.slice(0, 64)}" cannot be written to a Mosquitto file`);
}

export function passwordFileText(credentials: readonly LiveCredential[]): string {
  const lines = [...credentials]
    .sort((a, b) => (a.username < b.username ? -1 : a.username > b.username ? 1 : 0))
    .map((c) => {
      checkUsername(c.username);
      if (!/^\$7\$\d+\$[A-Za-z0-9+/=]+\$[A-Za-z0-9+/=]+$/.test(c.passwordHash)) throw new ExportInputError(`the hash of "${c.username}" is not in Mosquitto's $7$ format`);
      return `${c.username}:${c.passwordHash}`;
    });
  return lines.length ? `${lines.join('\n')}\n` : '';
}

export function aclFileText(credentials: readonly LiveCredential[], topicRoot: string): string {
  if (!SAFE_ROOT.test(topicRoot)) throw new ExportInputError(`topic root "${topicRoot}" cannot be written to a Mosquitto ACL file`);
  const blocks = [...credentials]
    .sort((a, b) => (a.username < b.username ? -1 : a.username > b.username ? 1 : 0))
    .map((c) => {
      checkUsername(c.username);
      if (c.kind === 'vessel') {
        if (!c.vesselKey) throw new ExportInputError(`vessel credential "${c.username}" has no vessel`);
        return `user ${c.username}\ntopic write ${topicRoot}/${c.vesselKey}/+\n`;
      }
      return `user ${c.username}\ntopic read ${topicRoot}/+/+\n`;
    });
  return [
    '# Holdfast MQTT access, written by `holdfast broker export` (docs/access-control.md).',
    '# Each vessel may only publish under its own topic; the ingest worker may only read.',
    '# Nothing is granted to anonymous clients. Do not edit: export again instead.',
    '',
    ...blocks,
  ].join('\n');
}

/**
 * A mosquitto.conf snippet that uses the two files (absolute paths). It can
 * be pasted into mosquitto.conf or loaded with `include_dir`. With the
 * default `per_listener_settings false`, these settings apply to every
 * listener.
 */
export function configSnippetText(passwordFile: string, aclFile: string): string {
  return [
    '# Holdfast MQTT access, written by `holdfast broker export`.',
    'allow_anonymous false',
    `password_file ${passwordFile}`,
    `acl_file ${aclFile}`,
    '',
  ].join('\n');
}
