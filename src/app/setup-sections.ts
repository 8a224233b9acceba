/**
 * The plain sections of the set-up form: grid (with the polarization), absorber and time
 * steps. Each is a template built from a FieldKit; the figures in their hints come from
 * the scenario layer. The medium has its own file (medium-section.ts).
 */
import { html, type TemplateResult } from 'lit';
import type { DerivedQuantities } from '../scenario/derived.ts';
import { stabilityLimitOfDraft } from '../scenario/readouts.ts';
import { formatSI, formatSig } from '../scenario/units.ts';
import type { FieldKit } from './setup-fields.ts';

export function gridSection(kit: FieldKit): TemplateResult {
  return kit.section('Grid', ['grid'], html`
    ${kit.field('Nodes along x, nx', ['grid', 'nx'], { whole: true })}
    ${kit.field('Nodes along y, ny', ['grid', 'ny'], { whole: true })}
    ${kit.field('Cell size dx', ['grid', 'dx'], { unit: 'length' })}
    ${kit.field('Cell size dy', ['grid', 'dy'], { unit: 'length' })}
    ${kit.field('Courant number', ['grid', 'courant'])}
    ${polarizationField(kit)}
    <p class="hint">Node counts include the absorber layers. Courant number S = c·dt/min(dx, dy); the 2D limit is
      ${formatSig(stabilityLimitOfDraft(kit.host.draft) ?? NaN, 4)} for these cells.</p>
  `);
}

/** TMz (Ez, Hx, Hy; the default, left out of the file) or TEz (Hz, Ex, Ey). */
function polarizationField(kit: FieldKit): TemplateResult {
  const p = kit.get(['polarization']);
  return html`
    <div class="field">
      <label for="f-polarization">Polarization</label>
      <select id="f-polarization" aria-invalid=${kit.hasProblem(['polarization']) ? 'true' : 'false'} @change=${(e: Event) => {
        kit.host.emit([{ path: ['polarization'], value: (e.target as HTMLSelectElement).value === 'TEz' ? 'TEz' : undefined }]);
      }}>
        <option value="TMz" ?selected=${p !== 'TEz'}>TMz: Ez, Hx, Hy</option>
        <option value="TEz" ?selected=${p === 'TEz'}>TEz: Hz, Ex, Ey</option>
      </select>
      ${kit.problemText(['polarization'])}
    </div>`;
}

export function absorberSection(kit: FieldKit): TemplateResult {
  return kit.section('Absorber (CPML)', ['absorber'], html`
    ${kit.field('Cells per side', ['absorber', 'cells'], { whole: true, placeholder: '10' })}
    ${kit.field('Grading order m', ['absorber', 'order'], { placeholder: '3' })}
    ${kit.field('σmax / σopt', ['absorber', 'sigmaScale'], { placeholder: '1' })}
    ${kit.field('κmax', ['absorber', 'kappaMax'], { placeholder: '5' })}
    ${kit.field('αmax', ['absorber', 'alphaMax'], { fixedUnit: 'S/m', placeholder: '0.05' })}
  `);
}

export function stepsSection(kit: FieldKit, derived: DerivedQuantities | undefined): TemplateResult {
  return kit.section('Time steps', ['steps'], html`
    ${kit.field('Steps', ['steps'], { whole: true })}
    <p class="hint">Simulated time ${formatSI(derived?.duration_s ?? NaN, 's')}.</p>
  `);
}
