// Photographs a partner lets the site show: an image IRI → its IDs (read back through the partner's image IRI
// template) → the URL of the image (the partner's imageView template). No image bytes are copied into the site.
import { expandTemplate } from '../io/template.js';
import type { PartnerInfo } from './info.js';

interface Reader {
  partner: PartnerInfo;
  /** The template's text before its first variable: a cheap test before the regex. */
  prefix: string;
  re: RegExp;
  names: string[];
  view: string;
}

export interface ShownImage {
  url: string;
  /** The image ID as the partner catalogued it. */
  id: string;
  partner: PartnerInfo;
}

const escapeRe = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/**
 * The origin every URL of a template shares, or null when a variable sits in the scheme or host (then no
 * Content-Security-Policy can name it, and the partner's images are not shown).
 */
function originOf(view: string): string | null {
  try {
    const a = new URL(expandTemplate(view, { image: 'a', work: 'a' })),
      b = new URL(expandTemplate(view, { image: 'b', work: 'b' }));
    return a.origin === b.origin && /^https?:$/.test(a.protocol) ? a.origin : null;
  } catch {
    return null;
  }
}

export class Images {
  private readonly readers: Reader[] = [];
  /** Origins pages load images from (the Content-Security-Policy's img-src), sorted. */
  readonly origins: string[];

  constructor(partners: Iterable<PartnerInfo>) {
    const origins = new Set<string>();
    for (const partner of partners) {
      if (!partner.images) continue;
      const origin = originOf(partner.images.view);
      if (!origin) continue;
      origins.add(origin);
      const names: string[] = [];
      // RFC 6570 level 1 expands a value with every reserved character percent-encoded: no '/', '?' or '#' in it
      const pattern = partner.images.iri
        .split(/(\{(?:image|work)\})/)
        .map((piece) => {
          const m = /^\{(image|work)\}$/.exec(piece);
          if (!m) return escapeRe(piece);
          names.push(m[1]);
          return '([^/?#]*)';
        })
        .join('');
      this.readers.push({
        partner,
        prefix: partner.images.iri.slice(0, partner.images.iri.indexOf('{')),
        re: new RegExp(`^${pattern}$`),
        names,
        view: partner.images.view,
      });
    }
    this.origins = [...origins].sort();
  }

  get any(): boolean {
    return this.readers.length > 0;
  }

  /** The image of a photograph's IRI, when its partner lets pages show it; else undefined. */
  view(imageIri: string): ShownImage | undefined {
    for (const r of this.readers) {
      if (!imageIri.startsWith(r.prefix)) continue;
      const m = r.re.exec(imageIri);
      if (!m) continue;
      const vars: Record<string, string> = {};
      try {
        r.names.forEach((n, i) => (vars[n] = decodeURIComponent(m[i + 1])));
      } catch {
        continue;
      }
      if (vars.image === undefined) continue;
      return { url: expandTemplate(r.view, vars), id: vars.image, partner: r.partner };
    }
    return undefined;
  }
}
