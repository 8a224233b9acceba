/** A command-line usage problem: reported as one line, exit code 2. */
export class UsageError extends Error {}

export interface ParsedArgs {
  positional: string[];
  /** Each option once: a flag as true, a valued option with the last value given. */
  options: Map<string, string | true>;
  /** Every value of each valued option, in the order given (for options that may repeat, e.g. --with). */
  repeated?: Map<string, string[]>;
}

/**
 * Splits arguments into positionals and options. Options listed in `valued` take a value,
 * given as `--name value` or `--name=value`; the value may itself start with a dash
 * (`--target -70`). Options in `flags` take none. Anything else is a usage error. A valued
 * option given twice keeps its last value in `options` and every value in `repeated`.
 */
export function parseArgs(argv: readonly string[], valued: readonly string[], flags: readonly string[]): ParsedArgs {
  const positional: string[] = [];
  const options = new Map<string, string | true>();
  const repeated = new Map<string, string[]>();
  for (let k = 0; k < argv.length; k++) {
    const a = argv[k];
    if (!a.startsWith('--') || a === '--') {
      positional.push(a);
      continue;
    }
    const eq = a.indexOf('=');
    const name = eq >= 0 ? a.slice(2, eq) : a.slice(2);
    if (valued.includes(name)) {
      let value: string | undefined;
      if (eq >= 0) value = a.slice(eq + 1);
      else if (k + 1 < argv.length) value = argv[++k];
      if (value === undefined || value === '') throw new UsageError(`--${name} needs a value, e.g. --${name}=…`);
      options.set(name, value);
      repeated.set(name, [...(repeated.get(name) ?? []), value]);
    } else if (flags.includes(name)) {
      if (eq >= 0) throw new UsageError(`--${name} takes no value`);
      options.set(name, true);
    } else {
      const known = [...valued, ...flags].map((o) => `--${o}`).join(', ');
      throw new UsageError(`unknown option --${name}${known ? `; this command takes ${known}` : ''}`);
    }
  }
  return { positional, options, repeated };
}

/** Every value of a valued option, in the order given; empty when it was not given. */
export function listOption(args: ParsedArgs, name: string): string[] {
  const all = args.repeated?.get(name);
  if (all) return all.slice();
  const v = args.options.get(name);
  return typeof v === 'string' ? [v] : [];
}

/** A finite number from an option value, or a usage error naming the option. */
export function numberOption(args: ParsedArgs, name: string, fallback?: number): number | undefined {
  const v = args.options.get(name);
  if (v === undefined) return fallback;
  const x = typeof v === 'string' ? Number(v) : NaN;
  if (typeof v !== 'string' || v.trim() === '' || !Number.isFinite(x)) {
    throw new UsageError(`--${name}: "${String(v)}" is not a number; give e.g. --${name}=5`);
  }
  return x;
}
