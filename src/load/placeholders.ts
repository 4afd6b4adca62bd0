// A project file's values → warnings for what a starter project leaves to be filled in (base, publisher, licence).
import { readFileSync } from 'node:fs';
import type { Problem } from '../errors.js';
import type { ProjectConfig } from '../model.js';

/** What `concordat init` writes where only the consortium can decide. */
export const STARTER_PLACEHOLDERS = {
  publisherName: 'Name of the publishing consortium',
  license: 'https://licence.example.org/choose-one',
  base: 'https://concordance.example.org/',
} as const;

/** Domain names reserved for examples (RFC 2606 §3): an IRI there names no real licence. */
const EXAMPLE_HOST = /^(?:[^.]+\.)*example\.(?:org|com|net)$|\.example$/i;

const lineOf = (text: string, key: string) => {
  const i = text.indexOf(JSON.stringify(key));
  return i < 0 ? 0 : text.slice(0, i).split('\n').length;
};

/**
 * Warnings for a starter's placeholder base (and partner IRI templates minted under it), publisher name, and a licence
 * IRI in a domain reserved for examples. Every IRI minted under the placeholder base names nothing anyone can look up.
 */
export function placeholderWarnings(project: ProjectConfig, file: string): Problem[] {
  let text = '';
  try {
    text = readFileSync(file, 'utf8');
  } catch {
    /* the project file was read a moment ago; lines are a courtesy */
  }
  const out: Problem[] = [];
  if (project.base === STARTER_PLACEHOLDERS.base)
    out.push({
      file,
      line: lineOf(text, 'base'),
      field: 'base',
      message: `the base ${project.base} is still the starter's placeholder`,
      hint: 'write the address where the consortium publishes the release: every cluster, link and dataset IRI is minted under it',
    });
  project.partners.forEach((p, i) => {
    for (const key of ['workIri', 'imageIri', 'recordPage', 'imageView'] as const) {
      const template = p[key];
      if (typeof template !== 'string') continue;
      if (template.startsWith(STARTER_PLACEHOLDERS.base))
        out.push({
          file,
          line: lineOf(text, template),
          field: `partners[${i}].${key}`,
          message: `${key} of partner "${p.key}" is minted under the starter's placeholder base ${STARTER_PLACEHOLDERS.base}`,
          hint: "give the partner's own IRI template, or rewrite it under the consortium's real base",
        });
      else if ((key === 'workIri' || key === 'imageIri') && template.startsWith(project.base))
        out.push({
          file,
          line: lineOf(text, template),
          field: `partners[${i}].${key}`,
          message: `${key} of partner "${p.key}" mints the partner's records under the consortium's base, and \`concordat site\` does not answer them (they are catalogue records, not documents of the release)`,
          hint: "give the partner's own IRI template if it publishes one, or have the web server at the base answer them",
        });
    }
  });
  if (project.publisher.name === STARTER_PLACEHOLDERS.publisherName)
    out.push({
      file,
      line: lineOf(text, 'name'),
      field: 'publisher.name',
      message: "the publisher is still the starter's placeholder",
      hint: "write the consortium's name: it is published as the dataset's publisher",
    });
  let host = '';
  try {
    host = new URL(project.license).hostname;
  } catch {
    /* the schema checked it is an absolute IRI */
  }
  if (EXAMPLE_HOST.test(host))
    out.push({
      file,
      line: lineOf(text, 'license'),
      field: 'license',
      message: `the licence ${project.license} is a placeholder (a domain reserved for examples)`,
      hint: 'choose the licence the partners agreed on, e.g. https://creativecommons.org/licenses/by/4.0/',
    });
  return out;
}
