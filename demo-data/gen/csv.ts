// Rows of cells → delimited text (CSV or TSV) in a partner's own export habits: delimiter, BOM, line ends.

/** How one file is written. */
export interface TextFormat {
  delimiter: string;
  bom: boolean;
  eol: '\n' | '\r\n';
}

/** Plain comma-separated, LF line ends, no BOM: the format of evidence, decision and gold files. */
export const PLAIN_CSV: TextFormat = { delimiter: ',', bom: false, eol: '\n' };

/**
 * One cell, quoted when it holds the delimiter, a quote or a line break; quotes inside are doubled
 * (RFC 4180 §2, rules 5–7). A line break inside a cell stays as written, whatever the file's line ends.
 */
export function cell(value: string, delimiter: string): string {
  const needs = value.includes(delimiter) || value.includes('"') || value.includes('\n') || value.includes('\r');
  return needs ? `"${value.replaceAll('"', '""')}"` : value;
}

/** A header and rows → the whole file's text. */
export function delimited(header: readonly string[], rows: readonly (readonly string[])[], format: TextFormat): string {
  const lines = [header, ...rows].map((row) => row.map((v) => cell(v, format.delimiter)).join(format.delimiter));
  return (format.bom ? '\uFEFF' : '') + lines.join(format.eol) + format.eol;
}
