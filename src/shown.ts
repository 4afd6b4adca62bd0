// Text from users' files → text safe to show: long values cut, control characters visible, Markdown/HTML escaped.

/**
 * A message longer than this many UTF-16 code units is cut: room for a message naming several long IRIs, not for a
 * whole file's content (a choice, no source).
 */
export const SHOWN_MAX = 1000;
/** How much of a cut text is kept: its first 700 and last 250 code units, so the end of a message survives. */
export const SHOWN_HEAD = 700;
export const SHOWN_TAIL = 250;

/**
 * Cuts a long text in the middle: `abc…[10485700 characters cut]…xyz`, keeping the first {@link SHOWN_HEAD} and
 * the last {@link SHOWN_TAIL} code units (never half of a surrogate pair). Texts up to {@link SHOWN_MAX} are returned
 * as they are. Used for every problem's message, hint and field, so a 10 MB cell is never echoed whole.
 */
export function cut(text: string): string {
  if (text.length <= SHOWN_MAX) return text;
  let head = SHOWN_HEAD;
  let tail = text.length - SHOWN_TAIL;
  if (isHigh(text.charCodeAt(head - 1))) head--;
  if (isLow(text.charCodeAt(tail))) tail++;
  return `${text.slice(0, head)}…[${tail - head} characters cut]…${text.slice(tail)}`;
}
const isHigh = (c: number) => c >= 0xd800 && c <= 0xdbff;
const isLow = (c: number) => c >= 0xdc00 && c <= 0xdfff;

/**
 * C0 controls, DEL and C1 controls (Unicode §23.1; ISO 6429 ESC sequences start with U+001B or the C1 CSI U+009B),
 * and the bidirectional embedding, override and isolate controls (Unicode UAX #9 §2), which reorder what a reader sees.
 */
const INVISIBLE = /[\u0000-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/g;

/**
 * Shows control characters visibly: each as `\xHH` (C0, DEL, C1) or `\uHHHH` (bidi controls), so an ESC sequence in a
 * catalogue value prints as text instead of driving the terminal, and a line break cannot fake another message line.
 */
export function visible(text: string): string {
  return text.replace(INVISIBLE, (c) => {
    const n = c.charCodeAt(0);
    return n <= 0xff
      ? `\\x${n.toString(16).toUpperCase().padStart(2, '0')}`
      : `\\u${n.toString(16).toUpperCase().padStart(4, '0')}`;
  });
}

/**
 * Plain text → Markdown inline text that renders as the same text: controls made {@link visible}, then every character
 * that starts inline markup, an entity or raw HTML backslash-escaped (CommonMark 0.31 §2.4: any ASCII punctuation may
 * be escaped; `<` and `&` escaped so no raw HTML (§6.6) or entity (§2.5) is read; `|` for GFM tables §4.10, `~` for
 * GFM strikethrough §6.5).
 */
export function markdownText(text: string): string {
  return visible(text.replace(/\r\n|\r|\n/g, ' ')).replace(/[\\`*_[\]<>&|~!#]/g, '\\$&');
}
