/**
 * Light and dark themes. The colours live here once: as CSS custom properties (set on
 * gg-app and inherited through every shadow root) and as plain values for canvas and uPlot
 * drawing, which cannot read CSS directly without a layout pass.
 */
import { css, unsafeCSS } from 'lit';

export type ThemeName = 'light' | 'dark';

export interface Palette {
  bg: string; surface: string; raised: string; ink: string; muted: string; border: string; grid: string;
  accent: string; accentInk: string; error: string; warn: string; ok: string; focus: string;
  /** Chart series: FDTD, exact, their difference, the predicted phase error. */
  fdtd: string; exact: string; difference: string; predicted: string;
  /** Markers drawn over the field maps, with a halo of the other colour. */
  marker: string; markerHalo: string;
}

export const palettes: Record<ThemeName, Palette> = {
  light: {
    bg: '#f3f2ee', surface: '#ffffff', raised: '#f8f8f6', ink: '#1b2226', muted: '#56616a', border: '#cfd4d6', grid: '#e3e6e7',
    accent: '#0a6570', accentInk: '#ffffff', error: '#b0261c', warn: '#8a5300', ok: '#2d6a2f', focus: '#1b5fb0',
    fdtd: '#1f5aa6', exact: '#c14a09', difference: '#6b7680', predicted: '#7a3cc8',
    marker: '#111111', markerHalo: '#ffffff',
  },
  dark: {
    bg: '#121619', surface: '#1a1f23', raised: '#222a2f', ink: '#e6eaec', muted: '#a0aab1', border: '#39434a', grid: '#2b3338',
    accent: '#55b8c0', accentInk: '#0b1416', error: '#ff8b7e', warn: '#f0c15a', ok: '#8fd18f', focus: '#8ab8ff',
    fdtd: '#84b4ff', exact: '#ffa15e', difference: '#9aa5ad', predicted: '#caa8ff',
    marker: '#ffffff', markerHalo: '#000000',
  },
};

function tokens(p: Palette): string {
  return `
    --gg-bg: ${p.bg}; --gg-surface: ${p.surface}; --gg-raised: ${p.raised}; --gg-ink: ${p.ink};
    --gg-muted: ${p.muted}; --gg-border: ${p.border}; --gg-grid: ${p.grid}; --gg-accent: ${p.accent};
    --gg-accent-ink: ${p.accentInk}; --gg-error: ${p.error}; --gg-warn: ${p.warn}; --gg-ok: ${p.ok};
    --gg-focus: ${p.focus}; --gg-fdtd: ${p.fdtd}; --gg-exact: ${p.exact};
    --gg-difference: ${p.difference}; --gg-predicted: ${p.predicted};`;
}

/** Theme tokens for gg-app's host: light by default, dark when `theme="dark"`. */
export const themeTokens = css`
  :host {
    ${unsafeCSS(tokens(palettes.light))}
    color-scheme: light;
    --gg-font: system-ui, -apple-system, 'Segoe UI', Roboto, 'Helvetica Neue', Arial, sans-serif;
    --gg-mono: ui-monospace, 'SFMono-Regular', 'DejaVu Sans Mono', Menlo, Consolas, monospace;
    --gg-radius: 6px;
  }
  :host([theme='dark']) {
    ${unsafeCSS(tokens(palettes.dark))}
    color-scheme: dark;
  }
`;

/** Buttons, inputs, focus rings and small print shared by the components. */
export const controlStyles = css`
  :host { font-family: var(--gg-font); color: var(--gg-ink); }
  button, select, input { font: inherit; color: inherit; }
  button {
    border: 1px solid var(--gg-border); background: var(--gg-raised); border-radius: var(--gg-radius);
    padding: 0.3rem 0.7rem; cursor: pointer; min-height: 2rem;
  }
  button:hover:not(:disabled) { border-color: var(--gg-accent); }
  button:disabled { opacity: 0.5; cursor: not-allowed; }
  button.primary { background: var(--gg-accent); color: var(--gg-accent-ink); border-color: var(--gg-accent); font-weight: 600; }
  button.small { min-height: 1.6rem; padding: 0.1rem 0.5rem; font-size: 0.85rem; }
  input, select {
    border: 1px solid var(--gg-border); background: var(--gg-surface); border-radius: 4px;
    padding: 0.25rem 0.4rem; min-height: 1.8rem; box-sizing: border-box;
  }
  input[aria-invalid='true'] { border-color: var(--gg-error); box-shadow: inset 0 0 0 1px var(--gg-error); }
  :is(button, input, select, canvas, a, summary, [tabindex]):focus-visible {
    outline: 2px solid var(--gg-focus); outline-offset: 2px;
  }
  .muted { color: var(--gg-muted); }
  .error-text { color: var(--gg-error); }
  .num { font-variant-numeric: tabular-nums; }
  .visually-hidden {
    position: absolute; width: 1px; height: 1px; overflow: hidden; clip: rect(0 0 0 0); white-space: nowrap;
  }
  .card {
    background: var(--gg-surface); border: 1px solid var(--gg-border); border-radius: 10px;
    padding: 0.75rem 0.9rem; box-sizing: border-box; min-width: 0;
  }
  .card-head { display: flex; align-items: center; gap: 0.5rem; flex-wrap: wrap; margin: 0 0 0.5rem; }
  .card-head h2, .card-head h3 { font-size: 1rem; margin: 0; margin-right: auto; }
`;
