import { mkdir, writeFile } from 'node:fs/promises';
import { join } from 'node:path';

/** One line of the command's readable output, on stdout. */
export const out = (line = '') => { process.stdout.write(`${line}\n`); };

/** One line of progress or notice, on stderr (stdout stays clean for --json). */
export const note = (line: string) => { process.stderr.write(`${line}\n`); };

/** Writes each named text file into `dir`, creating it if needed. */
export async function writeFiles(dir: string, files: Record<string, string>): Promise<void> {
  await mkdir(dir, { recursive: true });
  for (const [name, text] of Object.entries(files)) await writeFile(join(dir, name), text);
}
