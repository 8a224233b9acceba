/**
 * Reading the studies' JSON files for the report. The files come from elsewhere (another
 * machine, an older version, a hand edit), so nothing in them is trusted: every field is
 * read through these helpers, which give NaN, "" or [] for anything missing or of the wrong
 * kind, and every text ends up escaped. A file is a study when it holds a `candidates` list
 * and a `recommended` entry; absorber.json, resolution.json and convergence.json get their
 * own sections, any other study a generic one.
 */
import { formatBytes } from '../../scenario/units.ts';
import { dB, deg, si, sig } from './html.ts';

/** A study file found for the report. */
export interface ReportStudy {
  /** File name, e.g. "absorber.json": names the kind of study. */
  file: string;
  /** The folder it was read from, as given (shown in the report). */
  folder: string;
  /** The parsed JSON. */
  data: unknown;
}

export type StudyKind = 'absorber' | 'resolution' | 'convergence' | 'other';

type Obj = Record<string, unknown>;

/** True for a plain JSON object. */
export const isObject = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);
/** A field of an object, undefined when `o` is not one. */
export const field = (o: unknown, key: string): unknown => (isObject(o) ? o[key] : undefined);
/** A number field; NaN when missing, null or not a number. */
export const num = (o: unknown, key: string): number => { const v = field(o, key); return typeof v === 'number' ? v : NaN; };
/** A text field; "" when missing or not text. */
export const text = (o: unknown, key: string): string => { const v = field(o, key); return typeof v === 'string' ? v : ''; };
/** A list field; [] when missing or not a list. */
export const list = (o: unknown, key: string): unknown[] => { const v = field(o, key); return Array.isArray(v) ? v : []; };
/** An object field; null when missing or not an object. */
export const obj = (o: unknown, key: string): Obj | null => { const v = field(o, key); return isObject(v) ? v : null; };

/**
 * Whether parsed JSON is a study's result: an object with a `candidates` list and a
 * `recommended` entry (an object, or null when nothing met the budget).
 *
 * @example
 * isStudyJson({ candidates: [], recommended: null }); // true
 */
export function isStudyJson(data: unknown): boolean {
  return isObject(data) && Array.isArray(data.candidates) && 'recommended' in data && (data.recommended === null || isObject(data.recommended));
}

/**
 * The kind of a study by its file name.
 *
 * @example
 * studyKind({ file: 'resolution.json', folder: 'out', data: {} }); // 'resolution'
 */
export function studyKind(s: ReportStudy): StudyKind {
  const name = s.file.replace(/^.*[\\/]/, '').toLowerCase();
  if (name === 'absorber.json') return 'absorber';
  if (name === 'resolution.json') return 'resolution';
  if (name === 'convergence.json') return 'convergence';
  return 'other';
}

/**
 * The study's title in the report: "Absorber study", or "Study: NAME" for one without a section.
 *
 * @example
 * studyTitle({ file: 'staircase.json', folder: '.', data: {} }); // 'Study: staircase'
 */
export function studyTitle(s: ReportStudy): string {
  const kind = studyKind(s);
  if (kind !== 'other') return `${kind[0].toUpperCase()}${kind.slice(1)} study`;
  return `Study: ${s.file.replace(/^.*[\\/]/, '').replace(/\.json$/i, '')}`;
}

/**
 * A scalar value of a file as text: numbers to 4 figures, booleans as yes/no, null as "—".
 *
 * @example
 * valueText(0.123456); // '0.1235'
 */
export function valueText(v: unknown): string {
  if (typeof v === 'number') return sig(v, 4);
  if (typeof v === 'string') return v;
  if (typeof v === 'boolean') return v ? 'yes' : 'no';
  if (v === null || v === undefined) return '—';
  return Array.isArray(v) ? `${v.length} values` : 'an object';
}

/**
 * The scalar fields of an object, nested objects one level down as "outer.inner"; lists left out.
 *
 * @example
 * scalarFields({ cells: 8, project: { nx: 65 }, values: [1] }); // [['cells', 8], ['project.nx', 65]]
 */
export function scalarFields(o: Obj | null): [string, unknown][] {
  if (!o) return [];
  const out: [string, unknown][] = [];
  for (const [k, v] of Object.entries(o)) {
    if (isObject(v)) {
      for (const [k2, v2] of Object.entries(v)) if (!isObject(v2) && !Array.isArray(v2)) out.push([`${k}.${k2}`, v2]);
    } else if (!Array.isArray(v)) out.push([k, v]);
  }
  return out;
}

/** An absorber setting in words. */
export const gradingText = (c: unknown) =>
  `${sig(num(c, 'cells'), 4)} cells, m ${sig(num(c, 'order'), 4)}, sigmaScale ${sig(num(c, 'sigmaScale'), 4)}, κmax ${sig(num(c, 'kappaMax'), 4)}, αmax ${sig(num(c, 'alphaMax'), 4)} S/m`;

function absorberVerdict(d: unknown): string {
  const rec = obj(d, 'recommended');
  const target = num(d, 'target_dB');
  if (!rec) return `No absorber setting meets the target ${dB(target)}: nothing is recommended.`;
  const worst = text(rec, 'basis') !== 'probes' && Number.isFinite(num(rec, 'reflection_worst_dB'));
  const figure = worst ? `${dB(num(rec, 'reflection_worst_dB'))} worst case` : `${dB(num(rec, 'reflection_dB'))} at your probes`;
  return `Recommended: ${gradingText(rec)}: ${figure} (target ${dB(target)}, margin ${dB(num(rec, 'margin_dB'))}), engine memory ${formatBytes(num(rec, 'memory_bytes'))}.`;
}

function resolutionVerdict(d: unknown): string {
  const rec = obj(d, 'recommended');
  const budget = num(d, 'budget_deg');
  const size = num(d, 'size_wavelengths');
  if (!rec) return `No resolution meets the budget ${deg(budget)} across ${sig(size, 4)} wavelengths: nothing is recommended.`;
  const feature = text(rec, 'governed_by') === 'feature' ? ' Governed by the thinnest feature, finer than the phase budget needs.' : '';
  return `Recommended: ${sig(num(rec, 'cellsPerWavelength'), 4)} cells per wavelength (dx = ${si(num(rec, 'dx_m'), 'm')}): ${deg(num(rec, 'projected_error_deg'))} across ${sig(size, 4)} wavelengths, budget ${deg(budget)}.${feature}`;
}

function convergenceVerdict(d: unknown): string {
  const rec = obj(d, 'recommended');
  const budgets = `budgets ${dB(num(d, 'budget_dB'))}, ${deg(num(d, 'budget_deg'))}`;
  if (!rec) {
    const why = list(d, 'caveats').find((c) => typeof c === 'string') as string | undefined;
    return `No grid level is recommended (${budgets})${why ? `: ${why}` : ''}.`;
  }
  return `Recommended: level ${sig(num(rec, 'level'), 4)} (dx = ${si(num(rec, 'dx_m'), 'm')}): GCI ${dB(num(rec, 'gci_mag_dB'))} in magnitude, ${deg(num(rec, 'gci_phase_deg'))} in phase (${budgets}).`;
}

function otherVerdict(d: unknown): string {
  const rec = obj(d, 'recommended');
  if (!rec) return 'Nothing is recommended (recommended is null): no candidate met the budget.';
  const fields = scalarFields(rec).slice(0, 6).map(([k, v]) => `${k} ${valueText(v)}`);
  return `Recommended: ${fields.join(', ') || 'an entry without figures'}.`;
}

/**
 * The study's recommendation in one sentence, as the cover and the study's section print it.
 *
 * @example
 * studyVerdict({ file: 'convergence.json', folder: '.', data: { recommended: null, candidates: [] } });
 */
export function studyVerdict(s: ReportStudy): string {
  switch (studyKind(s)) {
    case 'absorber': return absorberVerdict(s.data);
    case 'resolution': return resolutionVerdict(s.data);
    case 'convergence': return convergenceVerdict(s.data);
    default: return otherVerdict(s.data);
  }
}

/**
 * Whether candidate `c` is the recommended entry: every number or text field the two share is equal.
 *
 * @example
 * isRecommended({ level: 2, dx_m: 2.5e-4, seconds: 20 }, { level: 2, dx_m: 2.5e-4, gci_mag_dB: 0.01 }); // true
 */
export function isRecommended(c: unknown, recommended: Obj | null): boolean {
  if (!recommended || !isObject(c)) return false;
  const shared = Object.entries(recommended).filter(([k, v]) => k in c && (typeof v === 'number' || typeof v === 'string'));
  return shared.length > 0 && shared.every(([k, v]) => c[k] === v);
}
