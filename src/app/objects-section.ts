/**
 * The objects of the set-up form: how they enter the grid (the fill), then one group per
 * object with its name, its coordinates (a polygon's points as a list), its material
 * (a perfect conductor, or a medium with ε∞, σ and optional poles), how many grid points
 * it took (src/engine/build-material-map.ts, counted by object-counts.ts) and Remove; Add
 * buttons place a new object where object-shapes.ts suggests. The field map draws them too.
 */
import { html, nothing, type TemplateResult } from 'lit';
import type { PathSegment } from '../scenario/path.ts';
import { FILL_KINDS } from '../scenario/object-schema.ts';
import type { Fill, Polarization } from '../scenario/types.ts';
import { formatSig } from '../scenario/units.ts';
import { tidy } from './grid-drawing.ts';
import { mediumFields } from './medium-section.ts';
import type { ObjectCounts } from './object-counts.ts';
import { draftObjectList, NEW_OBJECT_MATERIAL, newObject, newObjectSpot, objectNames, objectsValue, placementOfDraft, type ObjectShape } from './object-shapes.ts';
import { idOf, type FieldKit } from './setup-fields.ts';

const FILL_LABELS: Record<Fill, [label: string, hint: string]> = {
  staircase: ['staircase', 'each grid point takes the material it lies in'],
  average: ['average', 'in a cell an object cuts, ε∞ and σ are shared out by area; conductors stay staircased'],
  conformal: ['conformal', 'as average, and the cells and edges a conductor cuts keep the part outside the metal'],
};

const SHAPES: ObjectShape[] = ['circle', 'rectangle', 'polygon'];

const COORDINATES: Record<Exclude<ObjectShape, 'polygon'>, [key: string, label: string][]> = {
  circle: [['x', 'Centre x'], ['y', 'Centre y'], ['radius', 'Radius']],
  rectangle: [['x0', 'Corner x0'], ['y0', 'Corner y0'], ['x1', 'Opposite x1'], ['y1', 'Opposite y1']],
};

export interface ObjectsView {
  counts: ObjectCounts | undefined;
  /** True while the counts are of an earlier set-up. */
  countsPending: boolean;
  f0Hz: number | undefined;
}

function pointsEditor(kit: FieldKit, base: PathSegment[], k: number): TemplateResult {
  const path = [...base, 'points'];
  const points = kit.list(path) as unknown as unknown[];
  const len = kit.host.units.length;
  const pair = (p: unknown): [number, number] | undefined =>
    (Array.isArray(p) && typeof p[0] === 'number' && typeof p[1] === 'number' ? [p[0], p[1]] : undefined);
  return html`
    <div class="list cols-2 full-row">
      <div class="row head" aria-hidden="true"><span>Point</span><span>x (${len})</span><span>y (${len})</span><span></span></div>
      ${points.map((_p, m) => html`
        <div class="row" role="group" aria-label="Point ${m + 1} of object ${k + 1}">
          <span class="muted num">${m + 1}</span>
          ${kit.field(`Object ${k + 1} point ${m + 1} x`, [...path, m, 0], { unit: 'length', compact: true })}
          ${kit.field(`Object ${k + 1} point ${m + 1} y`, [...path, m, 1], { unit: 'length', compact: true })}
          <button type="button" class="small" ?disabled=${points.length <= 3} aria-label="Remove point ${m + 1} of object ${k + 1}" @click=${() => {
            kit.host.clearTyping();
            kit.host.emit([{ path, value: points.filter((_q, n) => n !== m) }]);
          }}>Remove</button>
        </div>
        ${kit.rowProblems([[`point ${m + 1}`, [...path, m]], ['x', [...path, m, 0], 'length'], ['y', [...path, m, 1], 'length']])}`)}
      <div class="list-actions">
        <button type="button" class="small" ?disabled=${points.length >= 64} @click=${() => {
          const a = pair(points[points.length - 1]);
          const b = pair(points[0]);
          const mid: [number, number] = a && b ? [tidy((a[0] + b[0]) / 2), tidy((a[1] + b[1]) / 2)] : [0, 0];
          kit.host.clearTyping();
          kit.host.emit([{ path, value: [...points, mid] }]);
        }}>Add point</button>
        <span class="muted hint">between the last point and the first</span>
      </div>
      ${kit.problemText(path, 'length')}
    </div>`;
}

function countText(v: ObjectsView, k: number, polarization: Polarization): string {
  const n = v.counts?.nodesPerObject[k];
  if (n === undefined) return v.countsPending ? 'counting grid points…' : 'grid points counted once the set-up is valid';
  const what = polarization === 'TEz' ? (n === 1 ? 'Ex/Ey point' : 'Ex/Ey points') : n === 1 ? 'Ez node' : 'Ez nodes';
  return `takes ${n} ${what}${v.countsPending ? ' (before the last change)' : ''}`;
}

function objectGroup(kit: FieldKit, v: ObjectsView, list: unknown[], k: number, polarization: Polarization): TemplateResult {
  const base: PathSegment[] = ['objects', k];
  const o = (list[k] ?? {}) as Record<string, unknown>;
  const shape = SHAPES.includes(o.shape as ObjectShape) ? (o.shape as ObjectShape) : undefined;
  const pec = o.material === 'pec';
  const materialId = idOf([...base, 'material']);
  const n = v.counts?.nodesPerObject[k];
  return html`
    <div class="group object" role="group" aria-label="Object ${k + 1}">
      <div class="group-head full-row">
        <strong>${k + 1}. ${shape ?? 'object'}</strong>
        <span class="muted count-readout" data-nodes=${n ?? ''}>${countText(v, k, polarization)}</span>
        <button type="button" class="small" aria-label="Remove object ${k + 1}" @click=${() => {
          kit.host.clearTyping();
          kit.host.emit([{ path: ['objects'], value: objectsValue(list.filter((_q, m) => m !== k)) }]);
        }}>Remove</button>
      </div>
      ${kit.textField(`Object ${k + 1} name`, [...base, 'name'])}
      ${shape === 'polygon' ? pointsEditor(kit, base, k) : shape ? COORDINATES[shape].map(([key, label]) => kit.field(label, [...base, key], { unit: 'length' })) : kit.problemText([...base, 'shape'])}
      <div class="field">
        <label for=${materialId} title="PEC: a perfect electric conductor; medium: ε∞, σ and optional poles">Material</label>
        <select id=${materialId} aria-invalid=${kit.hasProblem([...base, 'material']) ? 'true' : 'false'} @change=${(e: Event) => {
          kit.host.clearTyping();
          const value = (e.target as HTMLSelectElement).value === 'pec' ? 'pec' : structuredClone(NEW_OBJECT_MATERIAL);
          kit.host.emit([{ path: [...base, 'material'], value }]);
        }}>
          <option value="pec" ?selected=${pec}>PEC</option>
          <option value="medium" ?selected=${!pec}>medium</option>
        </select>
        ${pec ? kit.problemText([...base, 'material']) : nothing}
      </div>
      ${pec ? nothing : mediumFields(kit, [...base, 'material'], v.f0Hz, `object ${k + 1}`)}
      ${pec ? nothing : kit.problemText([...base, 'material'])}
      <div class="full-row">${kit.problemText(base, 'length')}</div>
    </div>`;
}

/**
 * The Objects section of the form: the fill, one group per object, and Add buttons.
 *
 * @example
 * html`${objectsSection(kit, { counts: controller.counts, countsPending: controller.pending, f0Hz: 1e10 })}`;
 */
export function objectsSection(kit: FieldKit, v: ObjectsView): TemplateResult {
  const list = draftObjectList(kit.host.draft);
  const fill = (kit.get(['fill']) as Fill | undefined) ?? 'staircase';
  const polarization = kit.get(['polarization']) === 'TEz' ? 'TEz' : 'TMz';
  const small = v.counts?.smallCells;
  const add = (shape: ObjectShape) => {
    const { grid, source } = placementOfDraft(kit.host.draft);
    kit.host.clearTyping();
    kit.host.emit([{ path: ['objects'], value: [...list, newObject(shape, newObjectSpot(grid, source, list.length), grid, objectNames(list))] }]);
  };
  return kit.section('Objects', ['objects'], html`
    <div class="field">
      <label for="f-fill">How objects enter the grid</label>
      <select id="f-fill" aria-invalid=${kit.hasProblem(['fill']) ? 'true' : 'false'}
        @change=${(e: Event) => kit.host.emit([{ path: ['fill'], value: (e.target as HTMLSelectElement).value }])}>
        ${FILL_KINDS.map((f) => html`<option value=${f} ?selected=${f === fill}>${FILL_LABELS[f][0]}</option>`)}
      </select>
      ${kit.problemText(['fill'])}
    </div>
    <p class="hint">${FILL_LABELS[fill]?.[1] ?? ''}</p>
    ${fill === 'conformal' && small && list.length ? html`
      <p class="hint" data-small-cells=${small.dropped}>Conformal fill: ${small.dropped} cut ${small.dropped === 1 ? 'cell' : 'cells'} too small for this time step
        ${small.dropped === 1 ? 'was' : 'were'} put into the metal; a cut keeping at least ${formatSig(small.threshold, 3)} of its ${polarization === 'TEz' ? 'cell' : 'edge'} is always kept.</p>` : nothing}
    ${list.map((_o, k) => objectGroup(kit, v, list, k, polarization))}
    <div class="list-actions">
      ${SHAPES.map((shape) => html`<button type="button" class="small" @click=${() => add(shape)}>Add ${shape}</button>`)}
      <span class="muted hint">or draw on the field map (Circle, Rectangle, Polygon tools)</span>
    </div>
    ${list.length ? html`<p class="hint">Later objects cover earlier ones. With objects other than exactly one circle there is no exact field to compare with; the convergence study judges the grid instead.</p>` : nothing}
  `, true);
}
