/**
 * A sweep's rows as the CLI's CSV: the header is the plan's columns, each row its cells, every
 * cell written by the sweep module's `formatCell`, joined by commas, one point a line in point
 * order. A text cell never spans lines (line breaks inside become spaces), as in the CLI's files.
 */
import { formatCell } from '../sweep/index.ts';
import type { SweepPlan, SweepRow } from '../sweep/types.ts';

const oneLine = (v: number | string): number | string => (typeof v === 'string' && /[\r\n]/.test(v) ? v.replace(/\s*[\r\n]+\s*/g, ' ') : v);

/**
 * The CSV text of a complete sweep.
 * @throws {Error} when a point's row is missing
 */
export function sweepCsv(plan: SweepPlan, rows: ReadonlyArray<SweepRow | undefined>): string {
  const lines = [plan.columns.map((c) => formatCell(c)).join(',')];
  for (let i = 0; i < plan.count; i++) {
    const r = rows[i];
    if (!r) throw new Error(`point ${i} has not been computed`);
    lines.push(r.cells.map((c) => formatCell(oneLine(c))).join(','));
  }
  return `${lines.join('\n')}\n`;
}
