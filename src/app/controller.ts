/**
 * What the person's actions do: edit the scenario, run it in the worker, load and save
 * files. Holds no state of its own beyond the worker; everything shown lives in the store.
 */
import { runExtras, runFiles, type RunFiles } from '../io/outputs.ts';
import { deriveQuantities } from '../scenario/derived.ts';
import { scenarioWarnings } from '../scenario/warnings.ts';
import { MEMORY_CAP_BYTES } from '../scenario/memory.ts';
import { fullGridDftBytes } from '../scenario/readouts.ts';
import { formatBytes } from '../scenario/units.ts';
import { demoScenario } from '../scenario/defaults.ts';
import { parseScenarioText, SCENARIO_FILE_CAP_BYTES, validateScenario } from '../scenario/parse.ts';
import { decodeScenario } from '../scenario/url.ts';
import type { Scenario } from '../scenario/types.ts';
import { applyEdits, type DisplayUnits, type Draft, type Edit } from './draft.ts';
import { saveText } from './download.ts';
import { plannedMaps } from './map-plan.ts';
import { saveDraft, saveTheme, saveUnits, writeLink, writeView, type View } from './persist.ts';
import type { FromWorker } from './protocol.ts';
import { RunClient } from './run-client.ts';
import type { Store } from './store.ts';
import type { ThemeName } from './theme.ts';

/** Largest scenario file the page reads, bytes (the command line has the same cap). */

export class AppController {
  private readonly client: RunClient;
  private runId = 0;
  private saveTimer: ReturnType<typeof setTimeout> | undefined;
  /** The scenario of the run in progress (or last run), for labelling its results. */
  private runScenario: Scenario | undefined;

  constructor(private readonly store: Store) {
    this.client = new RunClient({
      message: (m) => this.onWorkerMessage(m),
      crash: (message) => this.onWorkerCrash(message),
    });
    store.onFrameDemand((d) => this.client.send(d));
  }

  /** Resolves when the run worker has its engine compiled. */
  whenReady(): Promise<void> {
    return this.client.whenReady();
  }

  // ---- the scenario ----

  setDraft(draft: Draft): void {
    const check = validateScenario(draft);
    const derived = check.ok ? deriveQuantities(check.scenario) : undefined;
    this.store.set({ draft, check, derived, warnings: check.ok ? scenarioWarnings(check.scenario) : [] });
    clearTimeout(this.saveTimer);
    this.saveTimer = setTimeout(() => {
      saveDraft(draft);
      if (check.ok) writeLink(check.scenario);
    }, 250);
  }

  edit(edits: readonly Edit[]): void {
    this.setDraft(applyEdits(this.store.state.draft, edits));
  }

  loadDemo(): void {
    this.setDraft(demoScenario() as unknown as Draft);
    this.store.set({ notice: undefined });
  }

  /** Reads a scenario file; an invalid one is refused with its problems and nothing changes. */
  async loadFile(file: File): Promise<boolean> {
    if (file.size > SCENARIO_FILE_CAP_BYTES) {
      this.store.set({
        notice: {
          kind: 'error', title: `${file.name} was not loaded`,
          lines: [`It is ${formatBytes(file.size)}; scenario files are limited to 5 MiB. A scenario is a few kilobytes of JSON: is this the right file?`],
        },
      });
      return false;
    }
    const result = parseScenarioText(await file.text());
    if (!result.ok) {
      this.store.set({
        notice: {
          kind: 'error', title: `${file.name} was not loaded; the scenario on the page is unchanged`,
          lines: result.problems.map((p) => `${p.path}: ${p.message}`),
        },
      });
      return false;
    }
    this.setDraft(result.scenario as unknown as Draft);
    this.store.set({ notice: { kind: 'info', title: `Loaded ${file.name}`, lines: [] } });
    return true;
  }

  /** Opens the scenario of a link; a damaged one is reported and nothing changes. */
  openLink(encoded: string): void {
    const result = decodeScenario(encoded);
    if (!result.ok) {
      this.store.set({
        notice: { kind: 'error', title: 'The scenario in this link could not be used; the set-up is unchanged', lines: result.problems.map((p) => `${p.path}: ${p.message}`) },
      });
      return;
    }
    this.setDraft(result.scenario as unknown as Draft);
    this.store.set({ notice: { kind: 'info', title: 'Opened the scenario in the link', lines: [] } });
  }

  /** A scenario offered by another panel (e.g. a study's recommendation). */
  applyScenario(scenario: Scenario, note: string): void {
    this.setDraft(structuredClone(scenario) as unknown as Draft);
    this.store.set({ notice: { kind: 'info', title: note, lines: [] } });
  }

  saveScenario(): void {
    const { check } = this.store.state;
    if (!check.ok) return;
    saveText('scenario.json', `${JSON.stringify(check.scenario, null, 2)}\n`, 'application/json');
  }

  dismissNotice(): void {
    this.store.set({ notice: undefined });
  }

  setTheme(theme: ThemeName): void {
    saveTheme(theme);
    this.store.set({ theme });
  }

  setUnits(units: DisplayUnits): void {
    saveUnits(units);
    this.store.set({ units });
  }

  setLineFrequency(index: number): void {
    this.store.set({ lineFrequency: index });
  }

  /** Shows the error map at `hz` if the last run made it; the next run maps it first. */
  setMapFrequency(hz: number): void {
    this.store.set({ mapFrequencyHz: hz });
  }

  /** Switches the page to one of its sections and keeps the choice in the address. */
  setView(view: View): void {
    writeView(view);
    this.store.set({ view });
  }

  // ---- the run ----

  run(): void {
    const { check } = this.store.state;
    if (check.ok) this.startRun(check.scenario);
  }

  /**
   * Fault injection for the blow-up test: runs a scenario the set-up form would refuse
   * (e.g. a Courant number above the stability limit), as a corrupted input might.
   */
  runUncheckedForTest(scenario: Scenario): void {
    this.startRun(scenario);
  }

  private startRun(scenario: Scenario): void {
    const { run, mapFrequencyHz } = this.store.state;
    if (run.phase === 'running' || run.phase === 'paused' || run.phase === 'stopping') return;
    const runId = ++this.runId;
    this.runScenario = scenario;
    performance.clearMarks('gg-run-pressed');
    performance.mark('gg-run-pressed');
    this.store.setFrame(undefined);
    // Each error map is a full-grid DFT on top of the run: as many as fit under the cap.
    const derived = deriveQuantities(scenario);
    const mapFrequencies = plannedMaps(scenario, derived, mapFrequencyHz);
    const noRoom = scenario.frequencies.length > 0 && mapFrequencies.length === 0;
    const withMap = derived.memory_bytes + fullGridDftBytes(scenario.grid.nx, scenario.grid.ny);
    this.store.set({
      run: { phase: 'running', runId, stepsDone: 0, stepsTotal: scenario.steps, stepsPerSecond: 0 },
      notice: noRoom ? {
        kind: 'info', title: 'Running without the error map',
        lines: [`With an error map this run would need ${formatBytes(withMap)}, above the ${formatBytes(MEMORY_CAP_BYTES)} cap; probes, lines and exports are unaffected.`],
      } : undefined,
    });
    if (!this.client.send({ type: 'run', runId, scenario, mapFrequencies })) {
      this.store.setRun({ phase: 'failed', message: 'the run worker could not be started; reload the page' });
    }
  }

  pause(): void {
    if (this.store.state.run.phase !== 'running') return;
    this.client.send({ type: 'pause' });
    this.store.setRun({ phase: 'paused' });
  }

  resume(): void {
    if (this.store.state.run.phase !== 'paused') return;
    this.client.send({ type: 'resume' });
    this.store.setRun({ phase: 'running' });
  }

  stop(): void {
    const phase = this.store.state.run.phase;
    if (phase !== 'running' && phase !== 'paused') return;
    this.client.send({ type: 'stop' });
    this.store.setRun({ phase: 'stopping' });
  }

  /** Abandons any run, clears the results and field, and starts a fresh worker. */
  reset(): void {
    this.runId++;
    this.client.restart();
    this.store.setFrame(undefined);
    this.store.set({
      run: { phase: 'idle', runId: this.runId, stepsDone: 0, stepsTotal: 0, stepsPerSecond: 0 },
      results: undefined, resultsScenario: undefined, errorMaps: [],
    });
  }

  /** Fault injection for the recovery test: makes the worker die as a bug would. */
  crashWorkerForTest(): void {
    this.client.send({ type: 'crash' });
  }

  private onWorkerMessage(m: FromWorker): void {
    const { run } = this.store.state;
    if (m.type === 'failed' && m.runId === -1) {
      this.store.set({ notice: { kind: 'error', title: 'The engine could not be loaded', lines: [m.message] } });
      return;
    }
    if (m.runId !== run.runId) return; // a run that was reset or replaced
    switch (m.type) {
      case 'started':
        this.store.setRun({ stepsTotal: m.stepsTotal });
        break;
      case 'progress':
        this.store.setRun({ stepsDone: m.stepsDone, stepsPerSecond: m.stepsPerSecond });
        break;
      case 'frame':
        this.store.setFrame(m);
        break;
      case 'done': {
        performance.clearMarks('gg-results-arrived');
        performance.mark('gg-results-arrived');
        const scenario = this.runScenario;
        this.store.set({
          run: {
            ...run, phase: m.stopped ? 'stopped' : 'done', stepsDone: m.results.steps,
            stepsPerSecond: m.stepsPerSecond, runSeconds: m.runSeconds, timings: m.timings, energyLeftDb: m.energyLeftDb,
            stopped: m.blowUp ?? (m.stopped ? { step: m.results.steps, reason: 'interrupted' } : undefined),
            message: m.blowUp
              ? `run stopped: ${m.blowUp.reason}. What was recorded up to step ${m.blowUp.step} is kept and can be exported`
              : m.stopped ? `stopped at step ${m.results.steps} of ${m.results.stepsPlanned}; the comparison covers the steps taken` : undefined,
          },
          results: m.results,
          resultsScenario: scenario,
          errorMaps: m.errorMaps,
          lineFrequency: Math.min(this.store.state.lineFrequency, Math.max(0, m.results.frequencies.length - 1)),
          measuredCellRate: scenario ? m.stepsPerSecond * scenario.grid.nx * scenario.grid.ny : this.store.state.measuredCellRate,
        });
        break;
      }
      case 'failed':
        this.store.setRun({ phase: 'failed', message: m.message });
        break;
    }
  }

  private onWorkerCrash(message: string): void {
    const { run } = this.store.state;
    const busy = run.phase === 'running' || run.phase === 'paused' || run.phase === 'stopping';
    this.runId++;
    this.store.setRun({
      phase: busy ? 'failed' : run.phase,
      runId: this.runId,
      message: busy ? `the run worker crashed (${message}); a fresh worker has been started, press Run to try again` : run.message,
    });
    this.store.set({
      notice: { kind: 'error', title: 'The run worker crashed and was restarted', lines: [message, 'Your scenario and earlier results are kept; press Run to try again.'] },
    });
  }

  /** The four run files exactly as the command line writes them for the same results. */
  runFiles(): RunFiles | undefined {
    const { results, resultsScenario, run } = this.store.state;
    if (!results || !resultsScenario) return undefined;
    return runFiles(results, runExtras(resultsScenario, results, { runSeconds: run.runSeconds ?? 0, energyLeftDb: run.energyLeftDb ?? NaN, stopped: run.stopped }));
  }
}
