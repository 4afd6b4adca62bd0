// HTML text with every interpolated value escaped unless marked safe, and the page layout every site page shares.

/** Text already made safe HTML (only produced by `html` and the helpers below). */
export class Safe {
  constructor(readonly text: string) {}
  toString(): string {
    return this.text;
  }
}
type Part = Safe | string | number | undefined | null | false | readonly Part[];

const ENTITY: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };
/** Escapes text for element content and double- or single-quoted attributes (HTML Living Standard §13.1.2.3, §13.5). */
const SPECIAL = /[&<>"']/;
export const esc = (s: string) => (SPECIAL.test(s) ? s.replace(/[&<>"']/g, (c) => ENTITY[c]) : s);

function part(p: Part): string {
  if (p === undefined || p === null || p === false) return '';
  if (p instanceof Safe) return p.text;
  if (Array.isArray(p)) return p.map(part).join('');
  return esc(String(p));
}

/**
 * Tagged template: `html\`<p>${title}</p>\`` escapes `title`; nested `html` results and arrays of them pass through.
 */
export function html(strings: TemplateStringsArray, ...values: Part[]): Safe {
  let out = strings[0];
  for (let i = 0; i < values.length; i++) out += part(values[i]) + strings[i + 1];
  return new Safe(out);
}

/** Text from outside (titles, IDs) in a bidi-isolated span so right-to-left marks cannot reorder the page around it. */
export const text = (s: string | undefined) =>
  s === undefined ? html`<span class="none">none</span>` : html`<bdi>${s}</bdi>`;

/** Alternate representations of a page's document, named in `<link rel="alternate">` (HTML §4.6.7.1). */
export const ALTERNATES: readonly { ext: string; type: string; label: string }[] = [
  { ext: '.ttl', type: 'text/turtle', label: 'Turtle' },
  { ext: '.jsonld', type: 'application/ld+json', label: 'JSON-LD' },
  { ext: '.nt', type: 'application/n-triples', label: 'N-Triples' },
];

export interface PageInput {
  /** The page's document path without extension (`work/c000001`), or an HTML file's path without `.html`. */
  doc: string;
  title: string;
  siteTitle: string;
  /**
   * Whether the document has RDF alternates (false for index, search and vocabulary pages that are not documents of the
   * release).
   */
  alternates: boolean;
  /** The thing the page is about, shown under the heading. */
  iri?: string;
  main: Safe;
  licence?: string;
  /** The heading's id: the path of the resource the page is about, so `#<path>` lands on it. */
  anchor?: string;
}

/** Relative path from the page at `doc` to the site root (`work/c1` → `../`). */
const ROOTS = ['./', '../', '../../', '../../../', '../../../../'];
export function rootOf(doc: string): string {
  let depth = 0;
  for (let i = doc.indexOf('/'); i >= 0; i = doc.indexOf('/', i + 1)) depth++;
  return ROOTS[depth] ?? '../'.repeat(depth);
}

/** A whole page: skip link, header with the site's name, main content, footer with the licence and alternates. */
export function page(p: PageInput): string {
  const root = rootOf(p.doc);
  const name = p.doc.split('/').pop()!;
  const alts = p.alternates ? ALTERNATES.map((a) => ({ ...a, href: `${name}${a.ext}` })) : [];
  return html`<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${p.title} · ${p.siteTitle}</title>
<link rel="stylesheet" href="${root}assets/site.css">
<link rel="icon" href="${root}assets/icon.svg" type="image/svg+xml">
${alts.map(
  (a) => html`<link rel="alternate" type="${a.type}" href="${a.href}" title="${a.label}">
`,
)}<script src="${root}assets/site.js" defer></script>
</head>
<body>
<a class="skip" href="#main">Skip to the content</a>
<header class="masthead">
<p class="site-name"><a href="${root}index.html">${p.siteTitle}</a></p>
<nav aria-label="Site"><ul>
<li><a href="${root}index.html">Search</a></li>
<li><a href="${root}partners.html">Archives</a></li>
<li><a href="${root}dataset.html">Dataset</a></li>
<li><a href="${root}vocab/index.html">Vocabulary</a></li>
</ul></nav>
</header>
<main id="main" tabindex="-1">
<h1${p.anchor ? html` id="${p.anchor}"` : ''}>${p.title}</h1>
${p.iri ? html`<p class="iri">Identifier: <code>${p.iri}</code></p>` : ''}
${p.main}
</main>
<footer>
${alts.length ? html`<p>This page as data: ${alts.map((a, i) => html`${i ? ' · ' : ''}<a href="${a.href}" type="${a.type}">${a.label}</a>`)}.</p>` : ''}
${p.licence ? html`<p>Published under <a href="${p.licence}">${p.licence}</a>. Claims are research assertions about catalogue records, not attributions or authentications.</p>` : ''}
</footer>
</body>
</html>
`.text;
}
