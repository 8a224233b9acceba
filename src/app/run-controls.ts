import { css, html, LitElement } from 'lit';
import { customElement, property } from 'lit/decorators.js';
import { formatSig } from '../scenario/units.ts';
import type { RunState } from './store.ts';
import { controlStyles } from './theme.ts';

export type RunCommand = 'run' | 'pause' | 'resume' | 'stop' | 'reset';

const PHASE_TEXT: Record<RunState['phase'], string> = {
  idle: 'Ready',
  running: 'Running',
  paused: 'Paused',
  stopping: 'Stopping…',
  done: 'Finished',
  stopped: 'Stopped',
  failed: 'Failed',
};

/** Run, pause, resume, stop and reset, with progress and speed. Fires `gg-run-command`. */
@customElement('gg-run-controls')
export class GgRunControls extends LitElement {
  static styles = [controlStyles, css`
    :host { display: block; }
    .bar { display: flex; gap: 0.5rem; align-items: center; flex-wrap: wrap; }
    .status { display: flex; gap: 0.75rem; align-items: center; flex-wrap: wrap; font-size: 0.85rem; margin-top: 0.45rem; }
    progress { flex: 1 1 8rem; max-width: 320px; min-width: 0; height: 0.7rem; accent-color: var(--gg-accent); }
    .phase { font-weight: 600; }
    .phase.failed { color: var(--gg-error); }
    .blocked { color: var(--gg-error); font-size: 0.85rem; }
    .message { font-size: 0.85rem; margin: 0.35rem 0 0; }
    .message.failed { color: var(--gg-error); }
  `];

  @property({ attribute: false }) run: RunState | undefined;
  /** Why a run cannot start (invalid entries), or empty when it can. */
  @property() blocked = '';

  private command(c: RunCommand): void {
    this.dispatchEvent(new CustomEvent('gg-run-command', { detail: { command: c }, bubbles: true, composed: true }));
  }

  render() {
    const r = this.run;
    const phase = r?.phase ?? 'idle';
    const busy = phase === 'running' || phase === 'paused' || phase === 'stopping';
    const fraction = r && r.stepsTotal > 0 ? r.stepsDone / r.stepsTotal : 0;
    return html`
      <div class="bar" role="toolbar" aria-label="Run">
        <button class="primary" data-command="run" @click=${() => this.command('run')} ?disabled=${busy || this.blocked !== ''}
          aria-describedby=${this.blocked ? 'blocked' : ''}>Run</button>
        ${phase === 'paused'
          ? html`<button data-command="resume" @click=${() => this.command('resume')}>Resume</button>`
          : html`<button data-command="pause" @click=${() => this.command('pause')} ?disabled=${phase !== 'running'}>Pause</button>`}
        <button data-command="stop" @click=${() => this.command('stop')} ?disabled=${phase !== 'running' && phase !== 'paused'}>Stop</button>
        <button data-command="reset" @click=${() => this.command('reset')} ?disabled=${phase === 'idle' && !r?.stepsDone}>Reset</button>
        ${this.blocked ? html`<span id="blocked" class="blocked" role="alert">${this.blocked}</span>` : ''}
      </div>
      <div class="status">
        <span class="phase ${phase}" role="status" data-phase=${phase}>${PHASE_TEXT[phase]}</span>
        <progress max="1" .value=${fraction} aria-label="Run progress"></progress>
        <span class="num">${r ? `step ${r.stepsDone} of ${r.stepsTotal || '—'}` : ''}</span>
        <span class="num steps-per-second">${r && r.stepsPerSecond > 0 ? `${formatSig(r.stepsPerSecond, 3)} steps/s` : ''}</span>
        <span class="num">${r?.runSeconds !== undefined && !busy ? `${formatSig(r.runSeconds, 3)} s to results` : ''}</span>
      </div>
      ${r?.message ? html`<p class="message ${phase}">${r.message}</p>` : ''}
    `;
  }
}

declare global {
  interface HTMLElementTagNameMap { 'gg-run-controls': GgRunControls }
}
