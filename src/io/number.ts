// A number as written in a catalogue, evidence file or option → its value, by one grammar, or why it is not one.

/**
 * The one number grammar for every number read from a user's file or option: the lexical space of xsd:double without
 * INF and NaN (XSD 1.1 Part 2 §3.3.5.1, `doubleRep` less its special values), i.e. a decimal (§3.3.3.1
 * `decimalLexicalRep`) with an optional exponent. Chosen because it is what spreadsheets and matchers write (Python
 * and NumPy print small scores as `1e-05`, pandas writes whole columns holding blanks as `1200.0`), it is the grammar
 * of the RDF literals these numbers become, and it has no hexadecimal, binary, `Infinity`, `_` or blank forms, which
 * JavaScript's `Number()` accepts and no exporter writes.
 */
export const NUMBER_GRAMMAR = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/** A decimal comma as a spreadsheet writes it in many locales (`0,92`, `1200,5`). */
const DECIMAL_COMMA = /^[+-]?\d*,\d+$/;
/** A thousands separator (`1,200`, `1.200.000`, `1 200`) in a whole number. */
const THOUSANDS = /^\d{1,3}([,. ]\d{3})+$/;

export type NumberRead = { ok: true; value: number } | { ok: false; hint: string };

/**
 * Reads `raw` (already trimmed) by {@link NUMBER_GRAMMAR}; `whole` asks for a whole number (`1200`, `1200.0`, `1.2e3`).
 * A refusal carries a hint: a decimal comma is named with the same number written with a decimal point (the
 * spreadsheet case), a thousands separator with the number written without it.
 */
export function readNumber(raw: string, whole = false): NumberRead {
  if (NUMBER_GRAMMAR.test(raw)) {
    const value = Number(raw);
    if (!Number.isFinite(value)) return { ok: false, hint: 'the number is too large' };
    if (whole && !Number.isInteger(value)) return { ok: false, hint: 'give a whole number' };
    return { ok: true, value };
  }
  if (whole && THOUSANDS.test(raw))
    return { ok: false, hint: `write it without a thousands separator: ${raw.replace(/[,. ]/g, '')}` };
  if (DECIMAL_COMMA.test(raw)) return { ok: false, hint: `write a decimal point: ${raw.replace(',', '.')}` };
  return { ok: false, hint: 'write digits with an optional decimal point and exponent, e.g. 0.93 or 1e-5' };
}
