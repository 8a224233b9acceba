/**
 * The command line's stepping loop for one scenario, shared by `run` and `report`: steps in
 * batches with the blow-up watch, a progress bar on stderr, and Ctrl-C stopping the run with
 * what was computed kept.
 */
import type { AnySimulation } from '../engine/create-simulation.ts';
import { drive, type DriveOutcome } from '../engine/batch-driver.ts';
import { ProgressBar } from './progress.ts';

/** How a run ended: the driver's outcome and whether Ctrl-C stopped it. */
export interface RunEnd {
  outcome: DriveOutcome;
  interrupted: boolean;
}

/**
 * Steps `sim` to its end (or a blow-up, or Ctrl-C) with a progress bar; `afterInterrupt`
 * finishes the bar's line when Ctrl-C stopped it ("writing what was computed").
 *
 * @example
 * const { outcome, interrupted } = await runWithProgress(sim, 'writing what was computed');
 */
export async function runWithProgress(sim: AnySimulation, afterInterrupt: string): Promise<RunEnd> {
  let interrupted = false;
  const onSignal = () => { interrupted = true; };
  process.on('SIGINT', onSignal);
  const bar = new ProgressBar('run');
  let outcome: DriveOutcome;
  try {
    outcome = await drive(sim, {
      cellsPerBatch: 4e7, watch: true, shouldStop: () => interrupted,
      afterBatch: async (s) => {
        bar.update(s.stepsDone, s.stepsTotal, 'steps');
        await new Promise((resolve) => setImmediate(resolve)); // lets Ctrl-C through
      },
    });
  } finally {
    process.off('SIGINT', onSignal);
  }
  bar.done(interrupted ? `interrupted at step ${sim.stepsDone} of ${sim.stepsDone + sim.stepsLeft}; ${afterInterrupt}` : '');
  return { outcome, interrupted };
}
