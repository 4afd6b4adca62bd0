// JSON text → where each value starts and each number's text, or where and why the text is not JSON (RFC 8259).

/** A value's place: the JSON path as an array of keys and indices. */
export type JsonPath = readonly (string | number)[];

/** What a scan of valid JSON found: offsets of every value (of its key, for object members) and numbers' text. */
export interface JsonSpots {
  /** Character offset where the value at a path starts (its key, for an object member). */
  offset: Map<string, number>;
  /** The number at a path as written (RFC 8259 §6), e.g. `1e-7`, `1.50`, a 30-digit integer. */
  number: Map<string, string>;
}

export type JsonScan = { ok: true; spots: JsonSpots } | { ok: false; offset: number; message: string };

/** The map key of a path. */
export const pathKey = (p: JsonPath): string => JSON.stringify(p);

/** RFC 8259 §6: `-? int frac? exp?`, int without leading zeros. */
const NUMBER = /-?(0|[1-9]\d*)(\.\d+)?([eE][+-]?\d+)?/y;
const LITERALS = ['true', 'false', 'null'];
const MAX_RECORDED_DEPTH = 32;
const UNRECORDED: JsonPath = [];

interface Frame {
  object: boolean;
  path: JsonPath;
  count: number;
}

/**
 * Scans JSON text by the grammar of RFC 8259 (§2 whitespace and structure, §4 objects, §5 arrays, §6 numbers, §7
 * strings), without recursion, so nesting of any depth is scanned. On the first error, returns its offset and a
 * message in words; a string that is not closed on its line is reported where it was opened.
 */
export function scanJson(text: string, record = true): JsonScan {
  const spots: JsonSpots = { offset: new Map(), number: new Map() };
  /** Paths are followed to this depth only (copying them deeper would cost depth² on hostile nesting). */
  const within = () => record && stack.length <= MAX_RECORDED_DEPTH;
  const child = (frame: Frame, k: string | number): JsonPath => (within() ? [...frame.path, k] : UNRECORDED);
  const stack: Frame[] = [];
  const n = text.length;
  let i = 0;
  const ws = () => {
    for (let c = text.charCodeAt(i); c === 0x20 || c === 0x09 || c === 0x0a || c === 0x0d; c = text.charCodeAt(++i));
  };
  const fail = (offset: number, message: string): JsonScan => ({ ok: false, offset, message });
  const what = (at: number) => (at >= n ? 'the end of the text' : `"${text[at]}"`);
  /** Scans a string starting at the quote at `i`; returns an error or null, leaving `i` after the closing quote. */
  const string = (): JsonScan | null => {
    const open = i++;
    for (;;) {
      if (i >= n) return fail(open, 'a string opened here is not closed');
      const c = text.charCodeAt(i);
      if (c === 0x22) {
        i++;
        return null;
      }
      if (c < 0x20)
        return c === 0x0a || c === 0x0d
          ? fail(open, 'a string opened here is not closed on its line')
          : fail(
              i,
              `control character U+${c.toString(16).toUpperCase().padStart(4, '0')} in a string (write it as \\u escape)`,
            );
      if (c === 0x5c) {
        const e = text[i + 1];
        if (e === 'u') {
          if (!/^[0-9A-Fa-f]{4}$/.test(text.slice(i + 2, i + 6)))
            return fail(i, '\\u must be followed by four hex digits');
          i += 6;
        } else if (e !== undefined && '"\\/bfnrt'.includes(e)) i += 2;
        else return fail(i, `"\\${e ?? ''}" is no escape in JSON (use \\\\ for a backslash)`);
      } else i++;
    }
  };
  let expectValue = true;
  let path: JsonPath = record ? [] : UNRECORDED;
  ws();
  for (;;) {
    if (expectValue) {
      const at = i;
      if (path !== UNRECORDED && !spots.offset.has(pathKey(path))) spots.offset.set(pathKey(path), at);
      const c = text[i];
      if (c === '{' || c === '[') {
        i++;
        ws();
        const frame: Frame = { object: c === '{', path, count: 0 };
        if (text[i] === (c === '{' ? '}' : ']')) {
          i++;
          expectValue = false;
          continue;
        }
        stack.push(frame);
        if (frame.object) {
          const key = memberKey(frame);
          if (typeof key !== 'string') return key;
          path = child(frame, key);
        } else path = child(frame, 0);
        continue;
      }
      if (c === '"') {
        const e = string();
        if (e) return e;
      } else if (c === '-' || (c !== undefined && c >= '0' && c <= '9')) {
        NUMBER.lastIndex = i;
        const m = NUMBER.exec(text);
        if (!m) return fail(i, 'a number needs digits after "-"');
        i += m[0].length;
        const next = text[i];
        if (next !== undefined && /[0-9.eE]/.test(next))
          return fail(
            at,
            `"${text.slice(at, i + 1)}" is not a JSON number (no leading zeros; digits after "." and "e")`,
          );
        if (path !== UNRECORDED) spots.number.set(pathKey(path), m[0]);
      } else {
        const word = LITERALS.find((w) => text.startsWith(w, i));
        if (!word)
          return fail(
            i,
            `expected a value (a string in double quotes, a number, true, false, null, { or [), found ${what(i)}`,
          );
        i += word.length;
      }
      expectValue = false;
      continue;
    }
    ws();
    const frame = stack[stack.length - 1];
    if (!frame) return i >= n ? { ok: true, spots } : fail(i, `text after the end of the JSON value: ${what(i)}`);
    const c = text[i];
    if (c === ',') {
      i++;
      ws();
      if (frame.object) {
        const key = memberKey(frame);
        if (typeof key !== 'string') return key;
        path = child(frame, key);
      } else path = child(frame, ++frame.count);
      expectValue = true;
      continue;
    }
    if (c === (frame.object ? '}' : ']')) {
      i++;
      stack.pop();
      continue;
    }
    return fail(i, `expected "," or "${frame.object ? '}' : ']'}", found ${what(i)}`);
  }

  /** Reads `"key"` `:` at `i` (after white space), records the key's offset and leaves `i` at the value. */
  function memberKey(frame: Frame): string | JsonScan {
    const at = i;
    if (text[i] !== '"')
      return fail(i, `expected a member name in double quotes, found ${what(i)} (no comma after the last member)`);
    const e = string();
    if (e) return e;
    const key = JSON.parse(text.slice(at, i)) as string;
    if (within()) spots.offset.set(pathKey([...frame.path, key]), at);
    ws();
    if (text[i] !== ':') return fail(i, `expected ":" after the member name, found ${what(i)}`);
    i++;
    ws();
    return key;
  }
}
