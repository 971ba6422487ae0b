/**
 * What a new password must be. Source: NIST SP 800-63B-4 (2025), section
 * 3.1.1.2 ("Password Verifiers"):
 * - at least 15 characters when the password is the only factor (it is
 *   here), counting each Unicode code point as one character;
 * - at least 64 characters allowed; all printable characters, spaces and
 *   Unicode accepted; no composition rules (no "one digit, one capital");
 * - refused when it is a commonly used, expected or compromised value, or
 *   specific to the service or the user;
 * - never truncated (the whole password is hashed, lib/auth/password.ts).
 *
 * The list of common values below is short on purpose: at 15 characters
 * almost every entry of the big leaked-password lists is already too short.
 * A check against a breach corpus could be added here later.
 */
export const MIN_PASSWORD_LENGTH = 15;
/** Far above the 64 NIST asks for; bounds the work of hashing a pasted novel. */
export const MAX_PASSWORD_LENGTH = 1024;

const COMMON = [
  'passwordpassword',
  'password1234567',
  '123456789012345',
  'qwertyuiopasdfgh',
  'iloveyouiloveyou',
  'correcthorsebatterystaple',
  'letmeinletmein',
  'administrator123',
];

/** Words specific to this service (NIST: "context-specific words"). */
const SERVICE_WORDS = ['holdfast', 'dynamicpositioning', 'stationkeeping'];

export interface PasswordContext {
  email?: string;
  displayName?: string;
}

/** Why a new password is refused, as one sentence for the user; null when it is acceptable. */
export function passwordProblem(password: string, context: PasswordContext = {}): string | null {
  const length = [...password.normalize('NFKC')].length;
  if (length < MIN_PASSWORD_LENGTH) return `The password must have at least ${MIN_PASSWORD_LENGTH} characters (it has ${length}).`;
  if (length > MAX_PASSWORD_LENGTH) return `The password may have at most ${MAX_PASSWORD_LENGTH} characters.`;
  const plain = password.normalize('NFKC').toLowerCase();
  const compact = [...plain.replace(/\s/gu, '')];
  if (new Set(compact).size <= 2) return 'The password repeats one or two characters; choose a phrase of several words.';
  if (isSequence(compact)) return 'The password is a keyboard or number sequence; choose a phrase of several words.';
  const letters = lettersOf(plain);
  if (COMMON.includes(letters)) return 'The password is a commonly used one; choose another.';
  const contextWords = [
    ...SERVICE_WORDS,
    ...(context.email ? [context.email, context.email.split('@')[0]!] : []),
    ...(context.displayName ? [context.displayName] : []),
  ]
    .map((w) => lettersOf(w.normalize('NFKC').toLowerCase()))
    .filter((w) => w.length >= 4)
    .sort((a, b) => b.length - a.length);
  // What is left once the name, e-mail or service name is taken out must carry the strength on its own.
  let rest = letters;
  for (const word of contextWords) rest = rest.split(word).join('');
  if (rest.length < letters.length && [...rest].length < 8) {
    return 'The password is too close to your name, e-mail address or the name of this service.';
  }
  return null;
}

/** Letters and digits only: "Pass word!" and "password" are the same guess. */
function lettersOf(text: string): string {
  return text.replace(/[\s\p{P}\p{S}]/gu, '');
}

/** Each code point one step up or down from the previous (abcdef…, 98765…). */
function isSequence(chars: string[]): boolean {
  if (chars.length < 4) return false;
  const code = (i: number) => chars[i]!.codePointAt(0)!;
  const step = code(1) - code(0);
  if (Math.abs(step) !== 1) return false;
  for (let i = 2; i < chars.length; i++) if (code(i) - code(i - 1) !== step) return false;
  return true;
}
