import { z } from 'zod';

/**
 * Well-formed text. PostgreSQL cannot store NUL in text or jsonb, and a lone UTF-16 surrogate is
 * refused by jsonb and silently turned into U+FFFD in text columns (so two different strings can
 * become one). Both are refused at the boundary with the field named.
 *
 * The server applies `findIllFormedText` centrally to every JSON body and query string, so no route
 * can forget it; `textSchema` is for new schemas (and the client's forms) that want the same rule
 * in the contract itself.
 */

export const NUL_MESSAGE = 'Remove the control character (NUL) from this text.';
export const SURROGATE_MESSAGE = 'This text contains a broken character (a lone UTF-16 surrogate). Retype it.';

/** Limits of a JSON body's shape, checked before the body is parsed. */
export const JSON_MAX_DEPTH = 32;
export const JSON_MAX_ELEMENTS = 200_000; // the largest contract (fit-run, 20 000 points of a few fields) fits

/** True for a string without NUL and without lone surrogates. */
export function isWellFormedText(value: string): boolean {
  if (value.includes('\u0000')) return false;
  return isWellFormedUtf16(value);
}

function isWellFormedUtf16(value: string): boolean {
  const native = (value as { isWellFormed?: () => boolean }).isWellFormed;
  if (typeof native === 'function') return native.call(value);
  for (let i = 0; i < value.length; i += 1) {
    const c = value.charCodeAt(i);
    if (c >= 0xd800 && c <= 0xdbff) {
      const next = value.charCodeAt(i + 1);
      if (next >= 0xdc00 && next <= 0xdfff) i += 1;
      else return false;
    } else if (c >= 0xdc00 && c <= 0xdfff) return false;
  }
  return true;
}

/** The message for an ill-formed string, or null when it is fine. */
export function textProblem(value: string): string | null {
  if (value.includes('\u0000')) return NUL_MESSAGE;
  if (!isWellFormedUtf16(value)) return SURROGATE_MESSAGE;
  return null;
}

/** A zod string that refuses NUL and lone surrogates; chain limits after it like any z.string(). */
export function textSchema(params?: Parameters<typeof z.string>[0]) {
  return z.string(params).check((ctx) => {
    const problem = textProblem(ctx.value);
    if (problem) ctx.issues.push({ code: 'custom', message: problem, input: ctx.value });
  });
}

export type IllFormedText = { path: string; message: string };

/**
 * Walks a parsed JSON value (or a query object) without recursion and returns the first string —
 * value or key — that is not well-formed text, with its dotted path. Stops early at `maxNodes`.
 */
export function findIllFormedText(root: unknown, maxNodes = 1_000_000): IllFormedText | null {
  const stack: Array<{ value: unknown; path: string }> = [{ value: root, path: '' }];
  let seen = 0;
  while (stack.length) {
    const { value, path } = stack.pop()!;
    seen += 1;
    if (seen > maxNodes) return null;
    if (typeof value === 'string') {
      const problem = textProblem(value);
      if (problem) return { path: path || '_', message: problem };
    } else if (value && typeof value === 'object') {
      const entries = Array.isArray(value) ? value.map((v, i) => [String(i), v] as const) : Object.entries(value);
      for (let i = entries.length - 1; i >= 0; i -= 1) {
        const [key, child] = entries[i];
        const childPath = path ? `${path}.${key}` : key;
        const keyProblem = textProblem(key);
        if (keyProblem) return { path: path || '_', message: keyProblem };
        stack.push({ value: child, path: childPath });
      }
    }
  }
  return null;
}

export type JsonShapeProblem = { kind: 'depth' | 'elements'; message: string };

/**
 * Measures raw JSON text in one pass, without parsing or recursion: the deepest nesting of arrays
 * and objects and the number of values. Strings are skipped (their brackets do not count). Returns
 * the first limit exceeded, or null. Malformed JSON is left to the parser.
 */
export function checkJsonShape(
  text: string | Uint8Array,
  maxDepth = JSON_MAX_DEPTH,
  maxElements = JSON_MAX_ELEMENTS,
): JsonShapeProblem | null {
  // Raw UTF-8 bytes work as well as text: multi-byte sequences never contain ASCII bytes.
  const bytes = typeof text === 'string' ? null : text;
  const str = typeof text === 'string' ? text : '';
  const length = bytes ? bytes.length : str.length;
  let depth = 0;
  let elements = 0;
  let inString = false;
  for (let i = 0; i < length; i += 1) {
    const c = bytes ? bytes[i] : str.charCodeAt(i);
    if (inString) {
      if (c === 0x5c) i += 1; // backslash: skip the escaped character
      else if (c === 0x22) inString = false;
      continue;
    }
    if (c === 0x22) {
      inString = true;
    } else if (c === 0x5b || c === 0x7b) {
      depth += 1;
      if (depth > maxDepth) return { kind: 'depth', message: `The request body is nested too deeply (at most ${maxDepth} levels).` };
    } else if (c === 0x5d || c === 0x7d) {
      depth -= 1;
    } else if (c === 0x2c) {
      elements += 1;
      if (elements > maxElements) return { kind: 'elements', message: `The request body has too many items (at most ${maxElements}).` };
    }
  }
  return null;
}
