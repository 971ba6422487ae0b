'use server';

import { revalidatePath } from 'next/cache';
import { writeAudit } from '../../lib/auth/audit';
import { getSharedPool } from '../../lib/db/sharedPool';
import { acknowledgeFlag, closeFlag, type TransitionResult } from '../../lib/queries/flagLifecycle';
import { guardAction } from '../../lib/web/actionGuard';
import { acknowledgeForm, closeForm, firstProblem, formFields } from '../../lib/web/flagForm';
import { getSharedPrisma } from '../../lib/web/sharedPrisma';

/**
 * The watchlist's two mutations, as server actions: check the session, CSRF
 * and role (shore engineers, fleet managers and admins may act on flags;
 * lib/web/actionGuard.ts), validate the form on the server, make one
 * conditional transition (lib/queries/flagLifecycle.ts), record it in the
 * audit log, and re-render the pages that show the flag. The step is
 * recorded under the signed-in user's address, not a typed name.
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
  const gate = await guardAction(form, 'flag.acknowledge');
  if (!gate.ok) return { ok: false, message: gate.message };
  const parsed = acknowledgeForm.safeParse({ ...formFields(form), by: gate.principal.email });
  if (!parsed.success) return { ok: false, message: firstProblem(parsed.error) };
  const result = await acknowledgeFlag(getSharedPrisma(), parsed.data);
  if (result === 'done') {
    await writeAudit(getSharedPool(), { actor: gate.principal, action: 'flag.acknowledge', subject: `flag ${parsed.data.id}`, ip: gate.ip, detail: { note: parsed.data.note } });
  }
  return settle(result, `Acknowledged by ${parsed.data.by}.`);
}

export async function closeAction(_prev: FlagActionState, form: FormData): Promise<FlagActionState> {
  const gate = await guardAction(form, 'flag.close');
  if (!gate.ok) return { ok: false, message: gate.message };
  const parsed = closeForm.safeParse({ ...formFields(form), by: gate.principal.email });
  if (!parsed.success) return { ok: false, message: firstProblem(parsed.error) };
  const result = await closeFlag(getSharedPrisma(), parsed.data);
  if (result === 'done') {
    await writeAudit(getSharedPool(), {
      actor: gate.principal,
      action: 'flag.close',
      subject: `flag ${parsed.data.id}`,
      ip: gate.ip,
      detail: { reason: parsed.data.reason, note: parsed.data.note },
    });
  }
  return settle(result, `Closed as ${parsed.data.reason} by ${parsed.data.by}.`);
}
