/**
 * The Run button's work, one long step after another with the progress bar
 * moving through them and Cancel honoured between steps: the check by the
 * engine, the summary model (src/report), its sheet plan, the writing of the
 * new sheet through the workbook port, and the workbook's recalculation of
 * the sheet's formulas. Nothing is written before the check has run; a
 * cancel while writing removes the new sheet.
 *
 * @example
 *   const done = await runGuidedCheck(port, ready, (f, what) => bar(f, what), () => cancelled);
 *   done.sheet;    // 'Cutline summary'
 *   done.verdicts; // ['Units scoring at or above 60 are eligible. …', …]
 */
import { buildSummary } from '../report/summaryModel';
import type { Verdict } from '../report/summaryTypes';
import { LiveSheetPlan, planSheet } from '../report/sheetPlan';
import { CancelledError, WorkbookPort } from '../report/workbookPort';
import { runCheck } from './engine';
import type { CheckOptions, CheckResult } from './engine';
import { ReadyCheck } from './paneInputs';

export interface CheckDone {
  sheet: string;
  verdicts: Verdict[];
  result: CheckResult;
  plan: LiveSheetPlan;
}

/** Shares of the bar: the check, the writing, the recalculation. */
const SHARE = { check: 0.35, write: 0.45, settle: 0.2 };

/** Lets the page paint and the Cancel button be pressed. */
const breathe = (): Promise<void> => new Promise((resolve) => setTimeout(resolve, 0));

export async function runGuidedCheck(
  port: WorkbookPort,
  ready: ReadyCheck,
  progress: (fraction: number, what: string) => void,
  cancelled: () => boolean,
): Promise<CheckDone> {
  const stop = (): void => {
    if (cancelled()) throw new CancelledError();
  };
  progress(0.02, 'Checking the data: take-up, effects, the outcome–treatment test…');
  await breathe();
  stop();
  const options: CheckOptions = ready.eligible === 'detect' ? ready.options : { ...ready.options, eligible: ready.eligible };
  const result = runCheck(ready.input, options);
  if (!ready.density) delete result.density;
  progress(SHARE.check, 'Laying out the summary sheet…');
  await breathe();
  stop();
  const taken = await port.sheetNames();
  const model = buildSummary(result, {
    source: ready.source,
    data: ready.data,
    options,
    takenSheetNames: taken,
    names: ready.names,
  });
  const plan = planSheet(model, { source: ready.source });
  stop();
  await port.writeSheet(
    plan,
    (done, total, what) => progress(SHARE.check + (SHARE.write * done) / Math.max(1, total), what),
    cancelled,
  );
  progress(SHARE.check + SHARE.write, 'Recalculating the sheet’s formulas…');
  await port.settle((done, total, what) => progress(SHARE.check + SHARE.write + (SHARE.settle * done) / Math.max(1, total), what), cancelled);
  // A Cancel pressed while the workbook was busy is heard here.
  await breathe();
  if (cancelled()) {
    // Cancelled while the sheet recalculated: take the new sheet away, so that nothing was written.
    await port.deleteSheet(plan.sheet);
    throw new CancelledError();
  }
  progress(1, `Written to the sheet “${plan.sheet}”.`);
  return { sheet: plan.sheet, verdicts: model.verdicts, result, plan };
}
