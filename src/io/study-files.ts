/**
 * A study's files as text: the outputs its definition describes (CSV and JSON, README
 * "Outputs of studies") and the scenario files plus study.json of `--emit`.
 */
import type { EmitPlan, StudyOutput } from '../studies/definition.ts';
import { jsonForOutput, toCsv } from './csv.ts';

/** Every output of a study by file name. */
export function studyFiles(outputs: readonly StudyOutput[]): Record<string, string> {
  const files: Record<string, string> = {};
  for (const o of outputs) files[o.name] = o.kind === 'csv' ? toCsv(o.header, o.rows) : jsonForOutput(o.value);
  return files;
}

/** The runs of a study as scenario files for a batch scheduler, and study.json. */
export function emitFiles(e: EmitPlan): Record<string, string> {
  const files: Record<string, string> = {};
  for (const [name, scenario] of Object.entries(e.scenarios)) files[name] = `${JSON.stringify(scenario, null, 2)}\n`;
  files['study.json'] = jsonForOutput(e.manifest);
  return files;
}
