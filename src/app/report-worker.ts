/**
 * The page's report worker: builds the design-review report (src/io/report.ts, the same file
 * `gridgauge report` writes) from the page's results and studies, off the page's thread,
 * posting what it is doing as it goes.
 */
import { buildReport, type ReportInput } from '../io/report.ts';

declare const self: DedicatedWorkerGlobalScope;

export type ToReportWorker = { type: 'build'; id: number; input: ReportInput };
export type FromReportWorker =
  | { type: 'progress'; id: number; stage: string; fraction: number }
  | { type: 'done'; id: number; html: string; seconds: number }
  | { type: 'failed'; id: number; message: string };

const post = (m: FromReportWorker) => self.postMessage(m);

self.onmessage = (e: MessageEvent<ToReportWorker>) => {
  const { id, input } = e.data;
  const t0 = performance.now();
  try {
    post({ type: 'progress', id, stage: 'laying out the scenario, comparison, plots and studies', fraction: 0.1 });
    const html = buildReport(input);
    post({ type: 'progress', id, stage: 'done', fraction: 1 });
    post({ type: 'done', id, html, seconds: (performance.now() - t0) / 1000 });
  } catch (err) {
    post({ type: 'failed', id, message: err instanceof Error ? err.message : String(err) });
  }
};
