import { DUE_SHARE_LEFT, DUE_WITHIN_DAYS, SCORE_COMPONENTS, SCORE_WINDOW_DAYS } from '../../../lib/web/healthScore';

/** The health score's formula, written from the same constants the arithmetic uses. */
export default function ScoreFormula() {
  return (
    <section className="panel formula" id="score-formula" aria-labelledby="score-formula-title" data-testid="score-formula">
      <h2 id="score-formula-title">How the health score is worked out</h2>
      <p>
        Score = 100 × (1 − points lost ÷ weights counted), rounded. Each part loses a share of its weight, in a straight line
        from its first threshold (nothing lost) to its second (all of its weight lost). A part that cannot be worked out is left
        out and the others are scaled up to 100; the score is then marked <em>partial</em>. With no DP time in the last{' '}
        {SCORE_WINDOW_DAYS} days there is no score.
      </p>
      <table className="data-table formula__table">
        <thead>
          <tr>
            <th scope="col">Part</th>
            <th scope="col" className="num">
              Weight
            </th>
            <th scope="col">Figure read</th>
            <th scope="col" className="num">
              Nothing lost at
            </th>
            <th scope="col" className="num">
              All lost at
            </th>
          </tr>
        </thead>
        <tbody>
          {SCORE_COMPONENTS.map((c) => (
            <tr key={c.key}>
              <th scope="row">{c.label}</th>
              <td className="num">{c.weight}</td>
              <td>{c.figure}</td>
              <td className="num">
                {c.none} {c.unit}
              </td>
              <td className="num">
                {c.full} {c.unit}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="formula__foot">
        A thruster counts as due when {Math.round(DUE_SHARE_LEFT * 100)} % or less of its service interval (in wear hours) is
        left, or when its mean daily wear over the last 30 days would reach the interval within {DUE_WITHIN_DAYS} days. Bands:
        80 and above <strong>steady</strong>, 60–79 <strong>watch</strong>, below 60 <strong>needs a look</strong>. The weights and
        thresholds are Holdfast's own rule of thumb for comparing vessels with each other, not a class or industry measure.
      </p>
    </section>
  );
}
