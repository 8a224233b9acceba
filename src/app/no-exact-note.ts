/**
 * What the comparison says when a scenario has no exact reference (objects other than
 * exactly one circle, src/compare/reference.ts `exactKind`): there is nothing to hold the
 * FDTD values against, so the grid is judged by the convergence study instead; the button
 * opens it (`gg-open-study` {id: "convergence"}, handled by gg-app).
 */
import { css, html, type TemplateResult } from 'lit';

export const noExactStyles = css`
  .no-exact { display: flex; flex-wrap: wrap; gap: 0.3rem 0.8rem; align-items: center; margin: 0 0 0.6rem; padding: 0.5rem 0.7rem;
    border-left: 3px solid var(--gg-warn); background: var(--gg-raised); font-size: 0.88rem; }
  .no-exact p { margin: 0; flex: 1 1 16rem; }
`;

/**
 * The note, with a button that opens the convergence study; `host` sends the event.
 *
 * @example
 * html`${exactKind(scenario) === 'none' ? noExactNote(this) : nothing}`;
 */
export function noExactNote(host: HTMLElement): TemplateResult {
  const open = () => host.dispatchEvent(new CustomEvent('gg-open-study', { detail: { id: 'convergence' }, bubbles: true, composed: true }));
  return html`
    <div class="no-exact" role="note" data-note="no-exact">
      <p><strong>No exact reference: use the convergence study.</strong> Only a scenario without objects or with exactly one
        circle has an exact field; with these objects the FDTD values have nothing to be held against, so there are no errors to show.</p>
      <button type="button" class="small" @click=${open}>Open the convergence study</button>
    </div>`;
}
