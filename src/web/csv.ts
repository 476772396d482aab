/**
 * A sweep's rows as the CLI's CSV: the header is the plan's columns, each row its cells, every
 * cell written by the sweep module's `formatCell`, joined by commas, one point a line in point
 * order. A text cell never spans lines (line breaks inside become spaces), as in the CLI's files.
 */
import { headerText, rowText } from '../sweep/index.ts';
import type { SweepPlan, SweepRow } from '../sweep/types.ts';

/**
 * The CSV text of a complete sweep.
 * @throws {Error} when a point's row is missing
 */
export function sweepCsv(plan: SweepPlan, rows: ReadonlyArray<SweepRow | undefined>): string {
  let text = headerText('csv', plan.columns);
  for (let i = 0; i < plan.count; i++) {
    const r = rows[i];
    if (!r) throw new Error(`point ${i} has not been computed`);
    text += rowText('csv', plan.columns, r.cells);
  }
  return text;
}
