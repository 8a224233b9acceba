/**
 * The building blocks of the scenario's zod schemas (schema.ts, object-schema.ts): number
 * fields whose messages say what to write instead, objects and lists with messages of their
 * own, and the name rule. Kept apart so the schemas can share them without importing each
 * other.
 */
import * as z from 'zod';
import { describeValue, quote } from './show.ts';

export const NAME_MAX_LENGTH = 40;

/** What a number field holds, for messages: "give <what>, e.g. <example>". */
export interface FieldHint {
  what: string;
  example: string;
  /** For fields with a default: how to get it, e.g. "leave it out for 1". */
  fallback?: string;
}

export function give(h: FieldHint): string {
  return `give ${h.what}, e.g. ${h.example}${h.fallback ? `, or ${h.fallback}` : ''}`;
}

export function numberTypeMessage(input: unknown, h: FieldHint): string {
  if (input === undefined) return `required; ${give(h)}`;
  if (typeof input === 'number') return `${input} is not a finite number; ${give(h)}`; // NaN or ±Infinity
  if (typeof input === 'string' && input.trim() !== '' && Number.isFinite(Number(input))) {
    return `${quote(input)} is text; write the number without quotes: ${Number(input)}`;
  }
  return `expected a number but found ${describeValue(input)}; ${give(h)}`;
}

/** A finite number (zod 4 refuses NaN and ±Infinity as the wrong type). */
export function finiteNumber(h: FieldHint) {
  return z.number({ error: (iss) => numberTypeMessage(iss.input, h) });
}

export function positiveNumber(h: FieldHint) {
  return finiteNumber(h).gt(0, { error: (iss) => `${String(iss.input)} is not above 0; ${give(h)}` });
}

export function numberAtLeast(min: number, h: FieldHint, why: string) {
  return finiteNumber(h).gte(min, { error: (iss) => `${String(iss.input)} is below ${min}${why}; ${give(h)}` });
}

export function wholeNumberAtLeast(min: number, h: FieldHint, why: string) {
  return finiteNumber(h)
    .int({
      abort: true,
      error: (iss) => {
        const x = iss.input as number;
        if (Number.isInteger(x)) return `${x} is far too large; ${give(h)}`;
        // the nearest whole number, unless that is at or below the minimum: then the field's own example
        const near = Math.round(x);
        return `${x} is not a whole number; use a whole number such as ${near > min ? near : h.example}`;
      },
    })
    .gte(min, { error: (iss) => `${String(iss.input)} is below ${min}${why}; ${give(h)}` });
}

/** Message for an object or list of the wrong type; `leaveOut` says what leaving it out gives. */
export function containerMessage(input: unknown, description: string, leaveOut?: string): string {
  if (input === undefined) return `required; give ${description}`;
  return `expected ${description} but found ${describeValue(input)}${leaveOut ? `; or leave the field out ${leaveOut}` : ''}`;
}

export function objectOf<T extends z.core.$ZodLooseShape>(shape: T, description: string, leaveOut?: string) {
  return z.strictObject(shape, {
    error: (iss) => (iss.code === 'invalid_type' ? containerMessage(iss.input, description, leaveOut) : undefined),
  });
}

export function listOf<T extends z.ZodType>(item: T, description: string, leaveOut?: string) {
  return z.array(item, {
    error: (iss) => (iss.code === 'invalid_type' ? containerMessage(iss.input, description, leaveOut) : undefined),
  });
}

/** The letters-and-digits rule for probe and line names. Returns the problem, or undefined. */
export function nameProblem(name: string): string | undefined {
  const chars = Array.from(name);
  if (chars.length === 0) return `is empty; give a name of 1 to ${NAME_MAX_LENGTH} letters, digits, spaces, "_", "." or "-"`;
  if (chars.length > NAME_MAX_LENGTH) return `${quote(name)} is ${chars.length} characters long; use at most ${NAME_MAX_LENGTH}`;
  if (!/^[\p{L}0-9]$/u.test(chars[0])) return `${quote(name)} starts with ${JSON.stringify(chars[0])}; start the name with a letter or digit`;
  const bad = chars.find((c) => !/^[\p{L}\p{M}0-9 _.\-]$/u.test(c));
  if (bad !== undefined) return `${quote(name)} contains ${JSON.stringify(bad)}; use only letters, digits, spaces, "_", "." and "-"`;
  return undefined;
}

export const nameField = z
  .string({
    error: (iss) => iss.input === undefined
      ? `required; give a name of 1 to ${NAME_MAX_LENGTH} letters, digits, spaces, "_", "." or "-", e.g. "near"`
      : `expected a name in double quotes but found ${describeValue(iss.input)}`,
  })
  .refine((s) => nameProblem(s) === undefined, { error: (iss) => nameProblem(iss.input as string) });

