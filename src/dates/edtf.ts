// An EDTF string (date, interval, set, ISO 8601-2 century) → an interval of years, or why it is impossible.
import { type DateReading, type IntervalReading, LATEST_YEAR, impossible, unread } from './types.js';
import { SUB_YEAR_TOLERANCE, tolerance } from './calendar.js';
import { type Point, parsePoint } from './point.js';

const HINT = 'write EDTF such as 1475, 1475-03-02, 147X, 1470/1490 or 1470~ (LoC EDTF 2019)';
const CENTURY = /^(\d\d)([?~%])?$/;
const SET = /^(?:\[([^\]]*)\]|\{([^}]*)\})$/;

/** Years to widen one end by when it is approximate (see `tolerance`). */
function widen(p: Point): number {
  if (!p.approx) return 0;
  return p.span === 0 ? SUB_YEAR_TOLERANCE : tolerance(p.span);
}

/**
 * Reads EDTF (LoC EDTF Specification 2019-02-04, Levels 0–2; ISO 8601-2:2019 §4.2 centuries `14` = 1400–1499).
 * Intervals (`a/b`, open `..`, unknown empty ends → ±Infinity), sets (`[a,b..c]`, `{a,b}`, hull of members, no spaces
 * allowed as the spec says), dates with X digits, qualifiers, seasons, S and Y years. Approximate ends (`~`, `%`) are
 * widened by `tolerance`; `?` only sets `uncertain`; S gives the range of its significant digits, not widened.
 * Returns null when the text is not EDTF-shaped (free text may still read it).
 */
export function parseEdtf(text: string): DateReading | null {
  const c = CENTURY.exec(text);
  if (c !== null) return century(Number(c[1]), c[2]);
  const slash = text.indexOf('/');
  if (slash >= 0) return interval(text, slash);
  const s = SET.exec(text);
  if (s !== null) return set(s[1] ?? s[2]);
  const p = parsePoint(text, true);
  if (p === null) return null;
  if (typeof p === 'string') return impossible(p, HINT);
  const w = widen(p);
  return reading(p.minYear - w, p.maxYear + w, p.approx || p.significant, p.uncertain, p.century);
}

function reading(
  start: number,
  end: number,
  approximate: boolean,
  uncertain: boolean,
  century: number,
): IntervalReading {
  return century > 0
    ? { kind: 'interval', start, end, form: 'edtf', approximate, uncertain, century: { ordinal: century } }
    : { kind: 'interval', start, end, form: 'edtf', approximate, uncertain };
}

/** ISO 8601-2 century `14` (years 1400–1499), optionally qualified. */
function century(n: number, qual: string | undefined): DateReading {
  const start = n * 100;
  if (start > LATEST_YEAR) return impossible(`impossible century ${n}: in the future (after ${LATEST_YEAR})`, HINT);
  const approximate = qual === '~' || qual === '%';
  const w = approximate ? tolerance(100) : 0;
  return {
    kind: 'interval',
    start: start - w,
    end: start + 99 + w,
    form: 'century',
    approximate,
    uncertain: qual === '?' || qual === '%',
    century: { ordinal: n + 1 },
  };
}

/** EDTF Level 0 "Time Interval" and Level 1 "Extended Interval": start/end, `..` open, empty unknown. */
function interval(text: string, slash: number): DateReading | null {
  if (text.indexOf('/', slash + 1) >= 0) return null;
  const a = text.slice(0, slash),
    b = text.slice(slash + 1);
  if (a === '' && b === '') return unread('no date on either side of "/"', HINT);
  const p = a === '' || a === '..' ? undefined : parsePoint(a, false);
  const q = b === '' || b === '..' ? undefined : parsePoint(b, false);
  if (p === null || q === null) return null;
  if (typeof p === 'string') return impossible(p, HINT);
  if (typeof q === 'string') return impossible(q, HINT);
  if (p !== undefined && q !== undefined && p.minKey > q.maxKey) {
    return impossible(`impossible interval ${text}: ends before it starts`, 'put the earlier date first');
  }
  return reading(
    p === undefined ? -Infinity : p.minYear - widen(p),
    q === undefined ? Infinity : q.maxYear + widen(q),
    estimated(p) || estimated(q),
    (p?.uncertain ?? false) || (q?.uncertain ?? false),
    0,
  );
}

/** EDTF Level 2 "Set representation": one of `[...]` or all of `{...}`; both read as the hull of their members. */
function set(body: string): DateReading | null {
  if (body === '') return null;
  const parts = body.split(',');
  let start = Infinity,
    end = -Infinity,
    approx = false,
    uncertain = false;
  for (let i = 0; i < parts.length; i++) {
    const part = parts[i];
    const dots = part.indexOf('..');
    const left = dots < 0 ? part : part.slice(0, dots);
    const right = dots < 0 ? part : part.slice(dots + 2);
    if (
      dots >= 0 &&
      ((left === '' && i > 0) || (right === '' && i < parts.length - 1) || (left === '' && right === ''))
    )
      return null;
    const p = left === '' ? undefined : parsePoint(left, false);
    const q = right === '' ? undefined : dots < 0 ? p : parsePoint(right, false);
    if (p === null || q === null) return null;
    if (typeof p === 'string') return impossible(p, HINT);
    if (typeof q === 'string') return impossible(q, HINT);
    if (p !== undefined && q !== undefined && p.minKey > q.maxKey)
      return impossible(`impossible set member ${part}: ends before it starts`, HINT);
    start = Math.min(start, p === undefined ? -Infinity : p.minYear - widen(p));
    end = Math.max(end, q === undefined ? Infinity : q.maxYear + widen(q));
    approx ||= estimated(p) || estimated(q);
    uncertain ||= (p?.uncertain ?? false) || (q?.uncertain ?? false);
  }
  return reading(start, end, approx, uncertain, 0);
}

function estimated(p: Point | undefined): boolean {
  return p !== undefined && (p.approx || p.significant);
}
