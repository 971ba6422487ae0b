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

/**
 * One flag form: the flag's id and the session's CSRF token as hidden
 * fields, the form's own body, and the outcome of its last post. Marked
 * data-dirty while a note is typed and not yet sent.
 */
function FlagForm(props: {
  action: (payload: FormData) => void;
  state: FlagActionState;
  flagId: string;
  csrfToken: string;
  title: string;
  testId: string;
  children: React.ReactNode;
}) {
  const [dirty, setDirty] = useState(false);
  const onInput = (e: FormEvent<HTMLFormElement>) => {
    setDirty([...e.currentTarget.querySelectorAll('textarea')].some((t) => t.value.trim() !== ''));
  };
  return (
    <form
      action={props.action}
      onInput={onInput}
      // React resets a form after its action ran, which fires "reset": nothing is unsent then.
      onReset={() => setDirty(false)}
      data-dirty={dirty}
      className="flag-form"
      aria-label={`${props.title} flag ${props.flagId}`}
      data-testid={props.testId}
    >
      <input type="hidden" name="id" value={props.flagId} />
      <input type="hidden" name="csrf_token" value={props.csrfToken} />
      <h4>{props.title}</h4>
      {props.children}
      <Outcome state={props.state} />
    </form>
  );
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
  if (status === 'closed') return null;

  return (
    <div className="flag-actions">
      {status === 'open' ? (
        <FlagForm action={ackAction} state={ackState} flagId={flagId} csrfToken={csrfToken} title="Acknowledge" testId="acknowledge-form">
          <Why hint="What was checked, who is on it" />
          <Submit label="Acknowledge" />
        </FlagForm>
      ) : null}
      <FlagForm action={closeFormAction} state={closeState} flagId={flagId} csrfToken={csrfToken} title="Close" testId="close-form">
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
      </FlagForm>
    </div>
  );
}
