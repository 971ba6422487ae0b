'use client';

import { useActionState } from 'react';
import { useFormStatus } from 'react-dom';
import { registerAction, type RegisterState } from '../../admin/register/actions';
import DiffView from './DiffView';

function Submit({ label, intent }: { label: string; intent: 'check' | 'import' }) {
  const { pending } = useFormStatus();
  return (
    <button type="submit" name="intent" value={intent} className="button" disabled={pending}>
      {pending ? 'Working…' : label}
    </button>
  );
}

/** Choose a file → see every error or what would change → import → see what changed. */
export default function RegisterImport({ csrfToken }: { csrfToken: string }) {
  const [state, action] = useActionState<RegisterState, FormData>(registerAction, { phase: 'idle' });
  return (
    <div className="register-import">
      <form action={action} className="panel upload" aria-label="Check a fleet register file" data-testid="register-upload">
        <input type="hidden" name="csrf_token" value={csrfToken} />
        <label className="field">
          <span>Fleet register file (fleet-v1, JSON or YAML)</span>
          <input type="file" name="file" accept=".json,.yaml,.yml,application/json" required data-testid="register-file" />
        </label>
        <Submit label="Check file" intent="check" />
      </form>

      {state.phase === 'invalid' ? (
        <section className="problem" role="alert" data-testid="register-errors">
          <h2>{state.fileName ? `${state.fileName} was not imported` : 'Nothing imported'}</h2>
          <p>Every problem found, by its place in the file. Nothing changes until the file has none.</p>
          <ul>
            {state.errors.map((e) => (
              <li key={e}>
                <code>{e}</code>
              </li>
            ))}
          </ul>
        </section>
      ) : null}

      {state.phase === 'preview' ? (
        <section className="panel" data-testid="register-preview" aria-labelledby="preview-title">
          <h2 id="preview-title">What importing {state.fileName} would change</h2>
          <DiffView diff={state.diff} />
          <form action={action} aria-label="Import the checked file">
            <input type="hidden" name="csrf_token" value={csrfToken} />
            <input type="hidden" name="fileText" value={state.fileText} />
            <input type="hidden" name="fileName" value={state.fileName} />
            <Submit label="Import these changes" intent="import" />
          </form>
        </section>
      ) : null}

      {state.phase === 'imported' ? (
        <section className="panel panel--ok" role="status" data-testid="register-imported" aria-labelledby="imported-title">
          <h2 id="imported-title">Imported {state.fileName}</h2>
          <DiffView diff={state.diff} />
        </section>
      ) : null}
    </div>
  );
}
