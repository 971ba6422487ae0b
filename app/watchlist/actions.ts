'use server';

import { revalidatePath } from 'next/cache';
import { acknowledgeFlag, closeFlag, type TransitionResult } from '../../lib/queries/flagLifecycle';
import { acknowledgeForm, closeForm, firstProblem, formFields } from '../../lib/web/flagForm';
import { getSharedPrisma } from '../../lib/web/sharedPrisma';

/**
 * The watchlist's two mutations, as server actions: validate the form on the
 * server, make one conditional transition (lib/queries/flagLifecycle.ts),
 * and re-render the pages that show the flag. Until sign-in exists there is
 * no role check here; the access-control issue adds it (shore engineers,
 * fleet managers and admins may act on flags).
 */

export type FlagActionState = { ok: boolean; message: string } | null;

const REFUSED: Record<Exclude<TransitionResult, 'done'>, string> = {
  not_found: 'This flag no longer exists.',
  wrong_status: 'Someone else changed this flag meanwhile; the page now shows its current state.',
};

function settle(result: TransitionResult, done: string): FlagActionState {
  // Both outcomes re-render: a refused step means the page is out of date.
  revalidatePath('/watchlist');
  revalidatePath('/vessels/[key]', 'page');
  revalidatePath('/');
  return result === 'done' ? { ok: true, message: done } : { ok: false, message: REFUSED[result] };
}

export async function acknowledgeAction(_prev: FlagActionState, form: FormData): Promise<FlagActionState> {
  const parsed = acknowledgeForm.safeParse(formFields(form));
  if (!parsed.success) return { ok: false, message: firstProblem(parsed.error) };
  const result = await acknowledgeFlag(getSharedPrisma(), parsed.data);
  return settle(result, `Acknowledged by ${parsed.data.by}.`);
}

export async function closeAction(_prev: FlagActionState, form: FormData): Promise<FlagActionState> {
  const parsed = closeForm.safeParse(formFields(form));
  if (!parsed.success) return { ok: false, message: firstProblem(parsed.error) };
  const result = await closeFlag(getSharedPrisma(), parsed.data);
  return settle(result, `Closed as ${parsed.data.reason} by ${parsed.data.by}.`);
}
