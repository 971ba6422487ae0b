import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { getSharedPool } from '../../lib/db/sharedPool';
import { requestSession } from '../../lib/web/requestSession';
import { param, type RawSearchParams } from '../../lib/web/searchParams';

export const dynamic = 'force-dynamic';
export const metadata: Metadata = { title: 'Sign in' };

/** What the form says after a refused or ended attempt; never which part of the sign-in was wrong. */
function message(params: RawSearchParams): { problem: boolean; text: string } | null {
  const error = param(params, 'error');
  if (error === 'invalid') return { problem: true, text: 'That e-mail address and password do not match an active account.' };
  if (error === 'limited') {
    const retry = Number(param(params, 'retry'));
    const wait = Number.isFinite(retry) && retry > 0 ? `${Math.ceil(retry / 60)} min` : 'a while';
    return { problem: true, text: `Too many failed sign-ins. Try again in ${wait}.` };
  }
  const out = param(params, 'signed_out');
  if (out === 'everywhere') return { problem: false, text: 'Signed out on every device.' };
  if (out) return { problem: false, text: 'Signed out.' };
  return null;
}

export default async function SignInPage({ searchParams }: { searchParams: Promise<RawSearchParams> }) {
  const params = await searchParams;
  if ((await requestSession(getSharedPool())).check.ok) redirect('/');
  const note = message(params);
  const next = param(params, 'next');
  return (
    <section className="panel signin" aria-labelledby="signin-title">
      <h1 id="signin-title">Sign in to Holdfast</h1>
      {note ? (
        <p className={note.problem ? 'form-note form-note--problem' : 'form-note form-note--ok'} role={note.problem ? 'alert' : 'status'} data-testid="signin-note">
          {note.text}
        </p>
      ) : null}
      <form method="post" action="/auth/signin" data-testid="signin-form">
        {next ? <input type="hidden" name="next" value={next} /> : null}
        <label className="field">
          <span>E-mail address</span>
          <input type="email" name="email" required autoComplete="username" maxLength={320} />
        </label>
        <label className="field">
          <span>Password</span>
          <input type="password" name="password" required autoComplete="current-password" maxLength={1024} />
        </label>
        <button type="submit" className="button">
          Sign in
        </button>
      </form>
      <p className="table-note">Accounts are made by an administrator (<code>holdfast user create</code>). Sessions end after 30 minutes without use, and after 12 hours in any case.</p>
    </section>
  );
}
