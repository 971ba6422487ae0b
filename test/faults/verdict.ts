import type { FaultRunResult } from './faultRun';

/** Everything wrong with a fault run, one line each; empty when it passed. */
export function faultVerdict(r: FaultRunResult, expected: { records: number; kills: number }): string[] {
  const problems: string[] = [];
  if (r.published !== expected.records) problems.push(`published ${r.published} of ${expected.records} records`);
  if (r.lost !== 0) problems.push(`${r.lost} records lost`);
  if (r.duplicated !== 0) problems.push(`${r.duplicated} records duplicated or stray`);
  if (r.stored !== expected.records) problems.push(`stored ${r.stored} records, published ${expected.records}`);
  if (r.kills !== expected.kills) problems.push(`${r.kills} kills instead of ${expected.kills}`);
  if (r.databaseRestarts !== 1) problems.push(`${r.databaseRestarts} database restarts instead of 1`);
  if (r.brokerRestarts !== 1 && !r.brokerRestartSkipped) problems.push(`${r.brokerRestarts} broker restarts instead of 1`);
  if (r.unmarkedDays.length) problems.push(`days without a dirty mark: ${r.unmarkedDays.slice(0, 5).join(', ')}`);
  if (r.strayMarks.length) problems.push(`dirty marks on days without records: ${r.strayMarks.slice(0, 5).join(', ')}`);
  for (const exit of r.unexpectedExits) problems.push(exit);
  for (const line of r.alarmingLogLines.slice(0, 5)) problems.push(`worker log: ${line}`);
  return problems;
}
