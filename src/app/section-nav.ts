/**
 * The bar of the page's sections (Set-up, Results, Studies, Report): tabs in the WAI-ARIA
 * pattern (arrow keys, Home and End move between them), sticky at the top of the window so
 * every section is one click away however far down the page is scrolled.
 */
import { css, html, type TemplateResult } from 'lit';
import { VIEWS, type View } from './persist.ts';

const LABELS: Record<View, string> = { setup: 'Set-up', results: 'Results', studies: 'Studies', report: 'Report' };

export const viewStyles = css`
  nav.sections {
    position: sticky; top: 0; z-index: 5; display: flex; gap: 0.25rem; padding: 0.35rem 1.1rem 0;
    background: var(--gg-bg); border-bottom: 1px solid var(--gg-border); overflow-x: auto;
  }
  nav.sections .tabs { display: flex; gap: 0.25rem; }
  nav.sections button {
    border: 1px solid transparent; border-bottom: none; border-radius: 8px 8px 0 0; background: transparent;
    padding: 0.4rem 0.9rem; font-weight: 600; color: var(--gg-muted); margin-bottom: -1px; white-space: nowrap;
  }
  nav.sections button[aria-selected='true'] {
    background: var(--gg-surface); border-color: var(--gg-border); color: var(--gg-ink); box-shadow: inset 0 2px 0 var(--gg-accent);
  }
  nav.sections .dot { display: inline-block; width: 0.45rem; height: 0.45rem; border-radius: 50%; background: var(--gg-accent); margin-left: 0.35rem; vertical-align: middle; }
  @media (max-width: 480px) {
    nav.sections { padding: 0.35rem 0.5rem 0; }
    nav.sections .tabs { gap: 0; }
    nav.sections button { padding: 0.4rem 0.55rem; font-size: 0.9rem; }
  }
  .view[hidden] { display: none; }
`;

/** The section bar; `select` is called with the section chosen, `ready` marks sections with something new to see. */
export function sectionNav(current: View, select: (v: View) => void, ready: Partial<Record<View, boolean>>): TemplateResult {
  const onKey = (e: KeyboardEvent) => {
    const k = VIEWS.indexOf(current);
    const to = e.key === 'ArrowRight' ? VIEWS[(k + 1) % VIEWS.length]
      : e.key === 'ArrowLeft' ? VIEWS[(k + VIEWS.length - 1) % VIEWS.length]
      : e.key === 'Home' ? VIEWS[0] : e.key === 'End' ? VIEWS[VIEWS.length - 1] : undefined;
    if (!to) return;
    e.preventDefault();
    select(to);
    const bar = (e.currentTarget as HTMLElement);
    requestAnimationFrame(() => bar.querySelector<HTMLElement>(`#tab-${to}`)?.focus());
  };
  return html`
    <nav class="sections" aria-label="Sections of the page">
      <div role="tablist" class="tabs" aria-label="Sections" @keydown=${onKey}>
        ${VIEWS.map((v) => html`
          <button role="tab" id="tab-${v}" aria-controls="view-${v}" aria-selected=${v === current ? 'true' : 'false'}
            tabindex=${v === current ? '0' : '-1'} data-view=${v} @click=${() => select(v)}>${LABELS[v]}${ready[v] && v !== current ? html`<span class="dot" aria-label="(new)"></span>` : ''}</button>`)}
      </div>
    </nav>`;
}
