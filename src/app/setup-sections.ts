/**
 * The plain sections of the set-up form: grid, medium, absorber and time steps. Each is a
 * template built from a FieldKit; the figures in their hints come from the scenario layer.
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
    <p class="hint">Node counts include the absorber layers. Courant number S = c·dt/min(dx, dy); the 2D limit is
      ${formatSig(stabilityLimitOfDraft(kit.host.draft) ?? NaN, 4)} for these cells.</p>
  `);
}

export function mediumSection(kit: FieldKit): TemplateResult {
  return kit.section('Medium', ['medium'], html`
    ${kit.field('Relative permittivity εr', ['medium', 'epsR'], { placeholder: '1' })}
  `);
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
