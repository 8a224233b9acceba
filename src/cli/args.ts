/** A command-line usage problem: reported as one line, exit code 2. */
export class UsageError extends Error {}

export interface ParsedArgs {
  positional: string[];
  options: Map<string, string | true>;
}

/**
 * Splits arguments into positionals and options. Options listed in `valued` take a value,
 * given as `--name value` or `--name=value`; the value may itself start with a dash
 * (`--target -70`). Options in `flags` take none. Anything else is a usage error.
 */
export function parseArgs(argv: readonly string[], valued: readonly string[], flags: readonly string[]): ParsedArgs {
  const positional: string[] = [];
  const options = new Map<string, string | true>();
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
    } else if (flags.includes(name)) {
      if (eq >= 0) throw new UsageError(`--${name} takes no value`);
      options.set(name, true);
    } else {
      const known = [...valued, ...flags].map((o) => `--${o}`).join(', ');
      throw new UsageError(`unknown option --${name}${known ? `; this command takes ${known}` : ''}`);
    }
  }
  return { positional, options };
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
