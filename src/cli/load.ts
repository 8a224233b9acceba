import { readFile, stat } from 'node:fs/promises';
import { parseScenarioText, SCENARIO_FILE_CAP_BYTES } from '../scenario/parse.ts';
import type { Problem, Scenario } from '../scenario/types.ts';

/** Invalid input: each problem is printed on its own line, exit code 2. */
export class InvalidInput extends Error {
  constructor(readonly problems: Problem[]) {
    super(problems.map((p) => `${p.path}: ${p.message}`).join('\n'));
  }
}

/** Reads and validates a scenario file; throws InvalidInput naming the file's problems. */
export async function loadScenarioFile(path: string | undefined): Promise<Scenario> {
  if (!path) throw new InvalidInput([{ path: '(arguments)', message: 'no scenario file given; name a JSON scenario file, e.g. examples/demo.json' }]);
  let text: string;
  try {
    const info = await stat(path);
    if (!info.isFile()) throw new InvalidInput([{ path, message: 'is not a file; name a JSON scenario file' }]);
    if (info.size > SCENARIO_FILE_CAP_BYTES) {
      throw new InvalidInput([{ path, message: `is ${info.size} bytes, above the ${SCENARIO_FILE_CAP_BYTES}-byte cap for scenario files; is this the right file?` }]);
    }
    text = await readFile(path, 'utf8');
  } catch (e) {
    if (e instanceof InvalidInput) throw e;
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EACCES' ? 'permission denied' : `cannot be read (${code ?? String(e)})`;
    throw new InvalidInput([{ path, message: `${why}; check the path` }]);
  }
  const parsed = parseScenarioText(text);
  if (!parsed.ok) throw new InvalidInput(parsed.problems);
  return parsed.scenario;
}
