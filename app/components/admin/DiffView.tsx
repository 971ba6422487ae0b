import type { EntityDiff, RegisterDiff } from '../../../lib/web/registerDiff';
import { diffCounts } from '../../../lib/web/registerDiff';

/** A register diff: per vessel and campaign, created / updated (field by field) / unchanged. */

const STATUS_LABEL: Record<EntityDiff['status'], string> = { created: 'new', updated: 'changed', unchanged: 'unchanged' };

function Entities({ title, list }: { title: string; list: EntityDiff[] }) {
  if (list.length === 0) return null;
  return (
    <section className="diff__group">
      <h3>{title}</h3>
      <ul className="diff__list">
        {list.map((e) => (
          <li key={e.key} className={`diff__item diff__item--${e.status}`} data-testid="diff-item" data-key={e.key} data-status={e.status}>
            <span className={`status status--${e.status}`}>{STATUS_LABEL[e.status]}</span> <strong>{e.key}</strong>
            {e.status === 'updated' ? (
              <table className="data-table data-table--compact diff__fields">
                <thead>
                  <tr>
                    <th scope="col">Field</th>
                    <th scope="col">Now</th>
                    <th scope="col">From the file</th>
                  </tr>
                </thead>
                <tbody>
                  {e.changes.map((c) => (
                    <tr key={c.path} data-testid="diff-field" data-path={c.path}>
                      <th scope="row">
                        <code>{c.path}</code>
                      </th>
                      <td>{c.before ?? <span className="muted">—</span>}</td>
                      <td>{c.after ?? <span className="muted">—</span>}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            ) : null}
          </li>
        ))}
      </ul>
    </section>
  );
}

export default function DiffView({ diff }: { diff: RegisterDiff }) {
  const n = diffCounts(diff);
  return (
    <div className="diff" data-testid="register-diff">
      <p className="summary">
        <span>
          Vessels: {n.vessels.created} new, {n.vessels.updated} changed, {n.vessels.unchanged} unchanged
        </span>
        <span>
          Campaigns: {n.campaigns.created} new, {n.campaigns.updated} changed, {n.campaigns.unchanged} unchanged
        </span>
      </p>
      <Entities title="Vessels" list={diff.vessels} />
      <Entities title="Campaigns" list={diff.campaigns} />
      {diff.notInFile.vessels.length + diff.notInFile.campaigns.length > 0 ? (
        <p className="notice">
          In the register but not in this file, and left as they are: {[...diff.notInFile.vessels, ...diff.notInFile.campaigns].join(', ')}.
          An import never deletes a vessel, a campaign or any telemetry.
        </p>
      ) : null}
    </div>
  );
}
