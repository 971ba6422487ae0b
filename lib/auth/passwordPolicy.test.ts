import { describe, expect, it } from 'vitest';
import { MIN_PASSWORD_LENGTH, passwordProblem } from './passwordPolicy';

describe('passwordProblem (NIST SP 800-63B-4, 3.1.1.2)', () => {
  it('accepts a passphrase of 15 characters or more, without composition rules', () => {
    expect(MIN_PASSWORD_LENGTH).toBe(15);
    expect(passwordProblem('tidal anchor mug')).toBeNull();
    expect(passwordProblem('only lowercase letters here')).toBeNull();
    expect(passwordProblem('Καλημέρα θάλασσα')).toBeNull(); // Unicode is welcome
    expect(passwordProblem('ΑΒΓΔΕΖΗΘΙΚΛΜΝΞΟ')).toMatch(/sequence/); // … but not the alphabet
    expect(passwordProblem('x'.repeat(10) + ' ' + 'y'.repeat(3) + 'zq')).toBeNull();
  });

  it('counts code points, not UTF-16 units or bytes', () => {
    const fourteenEmoji = '🌊⚓🛟🌬️🧭🚢🌊⚓🛟🧭🚢🌊⚓🛟'.replace('\uFE0F', '');
    expect([...fourteenEmoji]).toHaveLength(14);
    expect(passwordProblem(fourteenEmoji)).toMatch(/at least 15 characters \(it has 14\)/);
    expect(passwordProblem(fourteenEmoji + '🧭')).toBeNull();
  });

  it('refuses short, repeated, sequential and common passwords', () => {
    expect(passwordProblem('fourteen chars')).toMatch(/at least 15/);
    expect(passwordProblem('aaaaaaaaaaaaaaaaaaaa')).toMatch(/repeats/);
    expect(passwordProblem('abababababababab')).toMatch(/repeats/);
    expect(passwordProblem('abcdefghijklmnop')).toMatch(/sequence/);
    expect(passwordProblem('Password1234567')).toMatch(/commonly used/);
    expect(passwordProblem('x'.repeat(1025))).toMatch(/at most 1024/);
  });

  it("refuses the service's name and the user's own name or e-mail with a little added", () => {
    expect(passwordProblem('holdfast-holdfast!')).toMatch(/too close/);
    expect(passwordProblem('ingrid.solberg2026', { email: 'ingrid.solberg@example.com' })).toMatch(/too close/);
    expect(passwordProblem('Ingrid Solberg 1990', { displayName: 'Ingrid Solberg' })).toMatch(/too close/);
    // The name inside a long phrase is fine: the rest carries the strength.
    expect(passwordProblem('ingrid sails the grey north sea at dawn', { displayName: 'Ingrid' })).toBeNull();
  });
});
