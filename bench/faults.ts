/**
 * npm run test:faults — the ingest fault suite at full size. A publisher
 * sends FAULTS_RECORDS (default 1,000,000) records with QoS 1, single
 * records and backlog batches, to a `holdfast ingest` process on a private
 * PostgreSQL and a private Mosquitto; meanwhile the worker is SIGKILLed
 * FAULTS_KILLS (default 20) times at random moments, and the broker and the
 * database are each restarted once. The store must then hold exactly the
 * published records, and every day they touched must be marked dirty.
 * FAULTS_SEED repeats a run. Last line:
 *   published=N stored=N lost=0 duplicated=0 kills=20
 * Exit status 1 when anything is off. test/faults.test.ts runs the same
 * faults on fewer records under `npm test`.
 */
import { runFaults } from '../test/faults/faultRun';
import { faultVerdict } from '../test/faults/verdict';

const records = Number(process.env.FAULTS_RECORDS ?? 1_000_000);
const kills = Number(process.env.FAULTS_KILLS ?? 20);
const seed = Number(process.env.FAULTS_SEED ?? Date.now() % 2 ** 31);

async function main() {
  console.log(`test:faults — ${records} records, ${kills} worker SIGKILLs, one broker restart, one database restart (seed ${seed})`);
  const result = await runFaults({ records, kills, seed, say: (line) => console.log(`  ${line}`) });
  const problems = faultVerdict(result, { records, kills });
  console.log(
    `broker_restarts=${result.brokerRestarts}${result.brokerRestartSkipped ? ' (skipped)' : ''} database_restarts=${result.databaseRestarts} ` +
      `startup_retries=${result.startupRetries} mean_worker_start_s=${result.meanStartSeconds.toFixed(2)} days_touched=${result.daysTouched} days_marked=${result.daysMarked} seconds=${result.seconds.toFixed(1)}`,
  );
  for (const p of problems) console.log(`PROBLEM: ${p}`);
  console.log(`published=${result.published} stored=${result.stored} lost=${result.lost} duplicated=${result.duplicated} kills=${result.kills}`);
  return problems.length === 0;
}

main().then(
  (ok) => process.exit(ok ? 0 : 1),
  (error) => {
    console.error(error);
    process.exit(1);
  },
);
