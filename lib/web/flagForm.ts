import { z } from 'zod';
import { CLOSE_REASONS } from '../queries/flagLifecycle';

/**
 * The watchlist's acknowledge and close forms, validated on the server
 * (app/watchlist/actions.ts). Every step needs a note: it is the record of
 * why the flag was acknowledged or closed. The name is who to ask later;
 * until sign-in exists it is typed, and an empty name is recorded as
 * DEFAULT_ACTOR.
 */
export const DEFAULT_ACTOR = 'shore engineer';
export const MAX_NOTE = 2000;
export const MAX_NAME = 100;

// bigserial: a bigint all the way to the UPDATE.
const id = z
  .string({ error: 'missing flag id' })
  .regex(/^[1-9][0-9]{0,18}$/, 'not a flag id')
  .transform((v) => BigInt(v));
const by = z
  .string()
  .optional()
  .transform((v) => (v ?? '').trim())
  .refine((v) => v.length <= MAX_NAME, `Name: at most ${MAX_NAME} characters`)
  .transform((v) => v || DEFAULT_ACTOR);
const note = z
  .string({ error: 'Note: write what was found or done' })
  .trim()
  .min(1, 'Note: write what was found or done')
  .max(MAX_NOTE, `Note: at most ${MAX_NOTE} characters`);

export const acknowledgeForm = z.object({ id, by, note });
export const closeForm = z.object({
  id,
  by,
  note,
  reason: z.enum(CLOSE_REASONS, { error: 'Reason: choose resolved or dismissed' }),
});


/** FormData → plain strings (files and repeated fields ignored). */
export function formFields(form: FormData): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [k, v] of form.entries()) if (typeof v === 'string' && !(k in out)) out[k] = v;
  return out;
}

/** The first problem, for the form to show; null when valid. */
export function firstProblem(error: z.ZodError): string {
  return error.issues[0]?.message ?? 'The form could not be read';
}
