/** One step into a scenario value: an object key or an array index. */
export type PathSegment = string | number;

const PLAIN_KEY = /^[A-Za-z_$][A-Za-z0-9_$]*$/;

/**
 * Write a path the way a person reads it: `grid.courant`, `probes[2].name`. Keys that are
 * not plain identifiers (an unknown key such as "a b") are written in brackets and quotes,
 * and very long keys are cut, since keys come from untrusted files.
 *
 * @example
 * renderPath(['probes', 2, 'name']); // 'probes[2].name'
 */
export function renderPath(segments: readonly PathSegment[]): string {
  let out = '';
  for (const s of segments) {
    if (typeof s === 'number') out += `[${s}]`;
    else if (PLAIN_KEY.test(s) && s.length <= 60) out += out === '' ? s : `.${s}`;
    else out += `[${JSON.stringify(s.length > 60 ? `${s.slice(0, 60)}…` : s)}]`;
  }
  return out;
}

/** True when `a` is `b`, lies inside `b`, or contains `b`. */
export function pathsOverlap(a: readonly PathSegment[], b: readonly PathSegment[]): boolean {
  const n = Math.min(a.length, b.length);
  for (let k = 0; k < n; k++) if (a[k] !== b[k]) return false;
  return true;
}
