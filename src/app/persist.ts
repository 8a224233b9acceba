/**
 * What the page keeps between visits: the scenario being edited (localStorage, so a reload
 * does not lose work), the theme and units, and the scenario in the address (`#s=…`, the
 * same encoding as src/scenario/url.ts) so that a copied link reproduces it.
 */
import { demoScenario } from '../scenario/defaults.ts';
import { decodeScenario, encodeScenario } from '../scenario/url.ts';
import type { Problem, Scenario } from '../scenario/types.ts';
import { DEFAULT_UNITS, type DisplayUnits, type Draft } from './draft.ts';
import type { ThemeName } from './theme.ts';

const KEY_DRAFT = 'gridgauge.draft.v1';
const KEY_THEME = 'gridgauge.theme';
const KEY_UNITS = 'gridgauge.units';
const LINK_KEY = 's';

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

/** The encoded scenario in the address, if any. */
export function linkParameter(): string | undefined {
  const hash = window.location.hash.replace(/^#/, '');
  const value = new URLSearchParams(hash).get(LINK_KEY);
  return value ?? undefined;
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

/** Puts the scenario in the address without adding a history entry. */
export function writeLink(scenario: Scenario): void {
  const url = new URL(window.location.href);
  url.hash = `${LINK_KEY}=${encodeScenario(scenario)}`;
  if (url.href !== window.location.href) window.history.replaceState(null, '', url);
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
  const u = readJson(KEY_UNITS) as Partial<DisplayUnits> | undefined;
  const pick = <K extends keyof DisplayUnits>(k: K, allowed: readonly DisplayUnits[K][]) =>
    u && allowed.includes(u[k] as DisplayUnits[K]) ? (u[k] as DisplayUnits[K]) : DEFAULT_UNITS[k];
  return {
    length: pick('length', ['m', 'mm', 'µm']),
    frequency: pick('frequency', ['MHz', 'GHz', 'THz']),
    time: pick('time', ['ns', 'ps', 'fs']),
  };
}

export function saveUnits(units: DisplayUnits): void {
  writeJson(KEY_UNITS, units);
}
