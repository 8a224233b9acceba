/**
 * What the page keeps between visits: the scenario being edited (localStorage, so a reload
 * does not lose work), the theme and units, and in the address the scenario (`#s=…`, the
 * same encoding as src/scenario/url.ts) so that a copied link reproduces it, and the section
 * of the page on show (`view=results`; left out for the set-up, the first section).
 */
import { demoScenario } from '../scenario/defaults.ts';
import { decodeScenario, encodeScenario } from '../scenario/url.ts';
import type { Problem, Scenario } from '../scenario/types.ts';
import { DEFAULT_UNITS, UNIT_CHOICES, type DisplayUnits, type Draft } from './draft.ts';
import type { ThemeName } from './theme.ts';

const KEY_DRAFT = 'gridgauge.draft.v1';
const KEY_THEME = 'gridgauge.theme';
const KEY_UNITS = 'gridgauge.units';
const LINK_KEY = 's';
const VIEW_KEY = 'view';

/** The sections of the page, in the order of its navigation. */
export const VIEWS = ['setup', 'results', 'studies', 'report'] as const;
export type View = (typeof VIEWS)[number];

export interface InitialScenario {
  draft: Draft;
  from: 'link' | 'saved' | 'demo';
  /** Problems of a link that could not be used (the page then falls back). */
  linkProblems?: Problem[];
}

function storage(): Storage | undefined {
  try {
    return window.localStorage;
  } catch {
    return undefined; // storage disabled by the browser
  }
}

function readJson(key: string): unknown {
  try {
    const text = storage()?.getItem(key);
    return text ? JSON.parse(text) : undefined;
  } catch {
    return undefined;
  }
}

function writeJson(key: string, value: unknown): void {
  try {
    storage()?.setItem(key, JSON.stringify(value));
  } catch {
    // full or disabled storage: the page still works, it just will not remember
  }
}

function hashParams(): URLSearchParams {
  return new URLSearchParams(window.location.hash.replace(/^#/, ''));
}

/** The encoded scenario in the address, if any. */
export function linkParameter(): string | undefined {
  return hashParams().get(LINK_KEY) ?? undefined;
}

/** The section named in the address, or the set-up. */
export function linkView(): View {
  const v = hashParams().get(VIEW_KEY);
  return (VIEWS as readonly (string | null)[]).includes(v) ? (v as View) : 'setup';
}

/** Writes the address's parameters (view first, then the scenario) without adding a history entry. */
function writeHash(params: URLSearchParams): void {
  const url = new URL(window.location.href);
  const parts: string[] = [];
  const view = params.get(VIEW_KEY);
  if (view && view !== 'setup') parts.push(`${VIEW_KEY}=${view}`);
  const link = params.get(LINK_KEY);
  if (link) parts.push(`${LINK_KEY}=${link}`);
  url.hash = parts.join('&');
  if (url.href !== window.location.href) window.history.replaceState(null, '', url);
}

/** Puts the section on show in the address, keeping the scenario there. */
export function writeView(view: View): void {
  const params = hashParams();
  params.set(VIEW_KEY, view);
  writeHash(params);
}

/** The scenario to open with: one from the link, else the one saved here, else the demo. */
export function initialScenario(): InitialScenario {
  const encoded = linkParameter();
  let linkProblems: Problem[] | undefined;
  if (encoded !== undefined) {
    const decoded = decodeScenario(encoded);
    if (decoded.ok) return { draft: decoded.scenario as unknown as Draft, from: 'link' };
    linkProblems = decoded.problems;
  }
  const saved = readJson(KEY_DRAFT);
  if (saved !== null && typeof saved === 'object' && !Array.isArray(saved)) {
    return { draft: saved as Draft, from: 'saved', linkProblems };
  }
  return { draft: demoScenario() as unknown as Draft, from: 'demo', linkProblems };
}

export function saveDraft(draft: Draft): void {
  writeJson(KEY_DRAFT, draft);
}

/** Puts the scenario in the address without adding a history entry, keeping the section on show. */
export function writeLink(scenario: Scenario): void {
  const params = hashParams();
  params.set(LINK_KEY, encodeScenario(scenario));
  writeHash(params);
}

export function savedTheme(): ThemeName {
  const t = readJson(KEY_THEME);
  if (t === 'light' || t === 'dark') return t;
  return window.matchMedia?.('(prefers-color-scheme: dark)').matches ? 'dark' : 'light';
}

export function saveTheme(theme: ThemeName): void {
  writeJson(KEY_THEME, theme);
}

export function savedUnits(): DisplayUnits {
  const u = readJson(KEY_UNITS) as Partial<Record<keyof DisplayUnits, unknown>> | undefined;
  const pick = <K extends keyof DisplayUnits>(k: K): DisplayUnits[K] =>
    u && (UNIT_CHOICES[k] as readonly unknown[]).includes(u[k]) ? (u[k] as DisplayUnits[K]) : DEFAULT_UNITS[k];
  return { length: pick('length'), frequency: pick('frequency'), time: pick('time'), conductivity: pick('conductivity') };
}

export function saveUnits(units: DisplayUnits): void {
  writeJson(KEY_UNITS, units);
}
