'use client';

import { useActionState, useState, type FormEvent } from 'react';
import { useFormStatus } from 'react-dom';
import { acknowledgeAction, closeAction, type FlagActionState } from '../../watchlist/actions';
import { MAX_NOTE } from '../../../lib/web/flagForm';

/**
 * Acknowledge and close forms for one flag. Plain forms posting to server
 * actions: they work before hydration too, and the server validates
 * everything again. A form with text typed into it is marked
 * data-dirty, which pauses the page's auto-refresh (AutoRefresh.tsx).
 */

function Submit({ label }: { label: string }) {
  const { pending } = useFormStatus();
  return (
    <button type="submit" className="button" disabled={pending} aria-disabled={pending}>
      {pending ? 'Saving…' : label}
    </button>
  );
}

function Outcome({ state }: { state: FlagActionState }) {
  if (!state) return null;
  return (
    <p className={state.ok ? 'form-note form-note--ok' : 'form-note form-note--problem'} role={state.ok ? 'status' : 'alert'} data-testid="action-outcome">
      {state.message}
    </p>
  );
}

function useDirty() {
  const [dirty, setDirty] = useState(false);
  const onInput = (e: FormEvent<HTMLFormElement>) => {
    const form = e.currentTarget;
    setDirty([...form.querySelectorAll('textarea')].some((t) => t.value.trim() !== ''));
  };
  // React resets a form after its action ran, which fires "reset": nothing is unsent then.
  return { dirty, onInput, onReset: () => setDirty(false) };
}

/** Why: the required note. Who is the signed-in user, recorded by the server. */
function Why({ hint }: { hint: string }) {
  return (
    <label className="field field--wide">
      <span>Note</span>
      <textarea name="note" required maxLength={MAX_NOTE} rows={2} placeholder={hint} />
    </label>
  );
}

export default function FlagActions({ flagId, status, csrfToken }: { flagId: string; status: string; csrfToken: string }) {
  const [ackState, ackAction] = useActionState(acknowledgeAction, null);
  const [closeState, closeFormAction] = useActionState(closeAction, null);
  const ack = useDirty();
  const close = useDirty();
  if (status === 'closed') return null;

  return (
    <div className="flag-actions">
      {status === 'open' ? (
        <form
          action={ackAction}
          onInput={ack.onInput}
          onReset={ack.onReset}
          data-dirty={ack.dirty}
          className="flag-form"
          aria-label={`Acknowledge flag ${flagId}`}
          data-testid="acknowledge-form"
        >
          <input type="hidden" name="id" value={flagId} />
          <input type="hidden" name="csrf_token" value={csrfToken} />
          <h4>Acknowledge</h4>
          <Why hint="What was checked, who is on it" />
          <Submit label="Acknowledge" />
          <Outcome state={ackState} />
        </form>
      ) : null}
      <form
        action={closeFormAction}
        onInput={close.onInput}
        onReset={close.onReset}
        data-dirty={close.dirty}
        className="flag-form"
        aria-label={`Close flag ${flagId}`}
        data-testid="close-form"
      >
        <input type="hidden" name="id" value={flagId} />
          <input type="hidden" name="csrf_token" value={csrfToken} />
        <h4>Close</h4>
        <fieldset className="field field--choice">
          <legend>Reason</legend>
          <label>
            <input type="radio" name="reason" value="resolved" required /> Resolved
          </label>
          <label>
            <input type="radio" name="reason" value="dismissed" /> Dismissed
          </label>
        </fieldset>
        <Why hint="What was done, or why it needs nothing" />
        <Submit label="Close flag" />
        <Outcome state={closeState} />
      </form>
    </div>
  );
}
