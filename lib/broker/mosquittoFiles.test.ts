import { describe, expect, it } from 'vitest';
import type { LiveCredential } from './credentials';
import { aclFileText, configSnippetText, ExportInputError, passwordFileText } from './mosquittoFiles';

const H = (n: number) => `$7$101$${'A'.repeat(15)}${n}$${'B'.repeat(86)}==`;
const CREDENTIALS: LiveCredential[] = [
  { id: 3, kind: 'vessel', username: 'vardel-tern', vesselKey: 'vardel-tern', passwordHash: H(1) },
  { id: 1, kind: 'ingest', username: 'holdfast_ingest', vesselKey: null, passwordHash: H(2) },
  { id: 2, kind: 'vessel', username: 'osk-meridian', vesselKey: 'osk-meridian', passwordHash: H(3) },
];

describe('Mosquitto files', () => {
  it('password file: one username:hash line per user, sorted', () => {
    expect(passwordFileText(CREDENTIALS)).toBe(`holdfast_ingest:${H(2)}\nosk-meridian:${H(3)}\nvardel-tern:${H(1)}\n`);
    expect(passwordFileText([])).toBe('');
  });

  it('ACL file: each vessel writes under its own key only, the worker reads, anonymous gets nothing', () => {
    const acl = aclFileText(CREDENTIALS, 'fleet/v1');
    const rules = acl.split('\n').filter((l) => l && !l.startsWith('#'));
    expect(rules).toEqual([
      'user holdfast_ingest',
      'topic read fleet/v1/+/+',
      'user osk-meridian',
      'topic write fleet/v1/osk-meridian/+',
      'user vardel-tern',
      'topic write fleet/v1/vardel-tern/+',
    ]);
    // The first rule line is a user line: nothing precedes it that would apply to anonymous clients.
    expect(rules[0]).toMatch(/^user /);
  });

  it('is the same text for the same credentials, whatever their order', () => {
    expect(aclFileText([...CREDENTIALS].reverse(), 'fleet/v1')).toBe(aclFileText(CREDENTIALS, 'fleet/v1'));
    expect(passwordFileText([...CREDENTIALS].reverse())).toBe(passwordFileText(CREDENTIALS));
  });

  it('refuses names and roots that would break a line of the files', () => {
    const bad = (c: Partial<LiveCredential>) => [{ ...CREDENTIALS[0]!, ...c }];
    expect(() => passwordFileText(bad({ username: 'a:b' }))).toThrow(ExportInputError);
    expect(() => passwordFileText(bad({ username: 'a\nuser x' }))).toThrow(ExportInputError);
    expect(() => passwordFileText(bad({ passwordHash: 'plain' }))).toThrow(ExportInputError);
    expect(() => aclFileText(CREDENTIALS, 'fleet v1')).toThrow(ExportInputError);
    expect(() => aclFileText(CREDENTIALS, 'fleet/#')).toThrow(ExportInputError);
    expect(() => aclFileText(bad({ vesselKey: null }), 'fleet/v1')).toThrow(ExportInputError);
  });

  it('config snippet: anonymous off, the two files by absolute path', () => {
    expect(configSnippetText('/etc/holdfast/passwd', '/etc/holdfast/acl').split('\n').filter((l) => l && !l.startsWith('#'))).toEqual([
      'allow_anonymous false',
      'password_file /etc/holdfast/passwd',
      'acl_file /etc/holdfast/acl',
    ]);
  });
});
