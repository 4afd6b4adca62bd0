// The route table → rules for Debian's nginx and Apache httpd: 303 See Other from every minted IRI to its document,
// chosen by Accept, documents and downloads served as files with their media types and the same headers as `serve`.
import { ROUTES, type ShardWidths } from './routes.js';

/**
 * Response headers every page carries (the same as `concordat serve`). Content-Security-Policy Level 3 (images also
 * from the servers of partners that let pages show their photographs); nosniff (Fetch §3.5).
 */
export function securityHeaders(imageOrigins: readonly string[] = []): Record<string, string> {
  return {
    'Content-Security-Policy': `default-src 'none'; script-src 'self'; style-src 'self'; img-src ${["'self'", ...imageOrigins].join(' ')}; connect-src 'self'; base-uri 'none'; form-action 'self'; frame-ancestors 'none'`,
    'X-Content-Type-Options': 'nosniff',
    'Referrer-Policy': 'no-referrer',
    'Cross-Origin-Resource-Policy': 'same-origin',
  };
}
/** Cache lifetimes: documents may change with the next release (an hour); the 303s are per release too. */
export const CACHE = { document: 'public, max-age=3600', redirect: 'public, max-age=3600' };

/**
 * One regex per route kind over the path after the base: group 1 (`rel`) the whole relative path, group 2 (`doc`)
 * the document part; `named` uses named groups, because nginx's map with regexes resets numbered captures.
 */
export function routePatterns(
  widths: ShardWidths,
): { kind: string; regex: string; named: string; doc: string; namedDoc: string; fragment: boolean }[] {
  return ROUTES.map((r) => {
    let regex: string, named: string, doc: string, namedDoc: string;
    if (r.shardFolder) {
      const k = widths[r.kind] ?? 1;
      const tail = r.pattern.replace(/^\^[^(]*\(\[0-9a-f\]\+\)/, '').replace(/\$$/, '');
      regex = `^(${r.shardFolder}/([0-9a-f]{${k}})[0-9a-f]*${tail})$`;
      named = `^(?<rel>${r.shardFolder}/(?<doc>[0-9a-f]{${k}})[0-9a-f]*${tail})$`;
      doc = `${r.shardFolder}/$2`;
      namedDoc = `${r.shardFolder}/$doc`;
    } else {
      const inner = r.pattern.replace(/^\^/, '').replace(/\$$/, '');
      regex = `^(${inner})$`;
      named = `^(?<rel>${inner.replace(/^\(/, '(?<doc>')})$`;
      doc = '$2';
      namedDoc = '$doc';
    }
    return { kind: r.kind, regex, named, doc, namedDoc, fragment: !!r.shardFolder || r.pattern.includes('(?:/.*)?') };
  });
}

const nginxHeaders = (extra: Record<string, string>, origins: readonly string[]) =>
  Object.entries({ ...securityHeaders(origins), ...extra })
    .map(([k, v]) => `    add_header ${k} "${v.replace(/"/g, '\\"')}" always;`)
    .join('\n');

/** nginx: a map for the http block and locations for the server block (nginx 1.22, Debian bookworm). */
function nginx(base: string, widths: ShardWidths, origins: readonly string[]): Record<string, string> {
  const P = new URL(base).pathname;
  const map = `# concordat site rules for ${base}: include in the http { } block.
# Accept → representation. nginx checks the regexes in order and takes the first that matches, so a client that
# lists an RDF type gets it even when it also lists text/html at a lower q; q-values are not weighed (concordat
# serve weighs them, RFC 9110 §12.5.1). No Accept or */* → HTML.
map $http_accept $concordat_ext {
    default html;
    "~*text/turtle" ttl;
    "~*application/n-triples" nt;
    "~*application/ld\\+json" jsonld;
    "~*application/json" jsonld;
}
`;
  const redirects = routePatterns(widths)
    .map(
      (r) => `    # ${r.kind}
    location ~ "^${P}${r.named.slice(1)}" {
        return 303 ${P}${r.namedDoc}.$concordat_ext${r.fragment ? '#$rel' : ''};
${nginxHeaders({ Vary: 'Accept', 'Cache-Control': CACHE.redirect }, origins)}
    }`,
    )
    .join('\n');
  const server = `# concordat site rules for ${base}: include in a server { } block whose root holds this folder at ${P}.
# Minted IRIs answer 303 See Other to their document (W3C "Cool URIs for the Semantic Web" §4.3), chosen by Accept;
# documents answer 200 as files: .html, .ttl (N-Triples lines, also valid Turtle), .jsonld, and .nt (the .ttl file
# sent as application/n-triples).
    charset utf-8;
    charset_types text/html text/turtle text/css text/javascript text/plain application/n-triples;
    index index.html;
    error_page 404 ${P}404.html;
${redirects}
    location ~ "^(${P}.+)\\.nt$" {
        types { }
        default_type application/n-triples;
        try_files $1.ttl =404;
${nginxHeaders({ 'Cache-Control': CACHE.document, Vary: 'Accept' }, origins)}
    }
    location ~ "\\.(html|ttl|jsonld|json|css|js|nq|csv|md|txt)$" {
        types {
            text/html html; text/turtle ttl; application/ld+json jsonld; application/json json; text/css css;
            text/javascript js; application/n-quads nq; text/csv csv; text/markdown md; text/plain txt;
        }
        try_files $uri =404;
${nginxHeaders({ 'Cache-Control': CACHE.document, Vary: 'Accept' }, origins)}
    }
    location ${P} {
        try_files $uri $uri/ =404;
${nginxHeaders({ 'Cache-Control': CACHE.document }, origins)}
    }
`;
  return { 'nginx-http.conf': map, 'nginx-server.conf': server };
}

/** Apache httpd 2.4 (mod_rewrite, mod_headers, mod_mime): a .htaccess-style file for the site folder. */
function apache(base: string, widths: ShardWidths, origins: readonly string[]): string {
  const P = new URL(base).pathname;
  const h = (extra: Record<string, string>, cond = '') =>
    Object.entries({ ...securityHeaders(origins), ...extra })
      .map(([k, v]) => `Header always set ${k} "${v.replace(/"/g, '\\"')}"${cond}`)
      .join('\n');
  return `# concordat site rules for ${base} (Apache httpd 2.4): put in the site folder as .htaccess (AllowOverride All), or
# inside its <Directory>. Needs mod_rewrite, mod_headers, mod_mime. Minted IRIs → 303 See Other to their document by Accept.
# media types named here, not left to the server's mime.types (the same table as the nginx rules)
AddType text/html .html
AddType text/turtle .ttl
AddType application/ld+json .jsonld
AddType application/json .json
AddType text/css .css
AddType text/javascript .js
AddType application/n-quads .nq
AddType text/csv .csv
AddType text/markdown .md
AddType text/plain .txt
AddCharset utf-8 .html .ttl .css .js
DirectoryIndex index.html
ErrorDocument 404 ${P}404.html
Options -Indexes -MultiViews
${h({ 'Cache-Control': CACHE.document, Vary: 'Accept' })}
RewriteEngine On
RewriteBase ${P}
# .nt: the .ttl file sent as N-Triples (a T flag is lost in an .htaccess rewrite; ForceType on the request is not)
RewriteRule ^(.+)\\.nt$ $1.ttl [END]
<If "%{THE_REQUEST} =~ m#^[A-Z]+ [^? ]+\\.nt[? ]#">
  ForceType application/n-triples
</If>
# Accept → extension; later rules win, so RDF types listed anywhere in Accept beat text/html (q-values not weighed).
RewriteRule ^ - [E=CONCORDAT_EXT:html]
RewriteCond %{HTTP_ACCEPT} application/json [NC]
RewriteRule ^ - [E=CONCORDAT_EXT:jsonld]
RewriteCond %{HTTP_ACCEPT} application/ld\\+json [NC]
RewriteRule ^ - [E=CONCORDAT_EXT:jsonld]
RewriteCond %{HTTP_ACCEPT} application/n-triples [NC]
RewriteRule ^ - [E=CONCORDAT_EXT:nt]
RewriteCond %{HTTP_ACCEPT} text/turtle [NC]
RewriteRule ^ - [E=CONCORDAT_EXT:ttl]
${routePatterns(widths)
  .map(
    (r) =>
      `# ${r.kind}\nRewriteRule "${r.regex}" "${P}${r.doc}.%{ENV:CONCORDAT_EXT}${r.fragment ? '#$1' : ''}" [R=303,NE,L]`,
  )
  .join('\n')}
`;
}

/** The rule files written into the site folder, by file name. */
export function serverRules(
  base: string,
  widths: ShardWidths,
  imageOrigins: readonly string[] = [],
): Record<string, string> {
  return { ...nginx(base, widths, imageOrigins), 'apache.htaccess': apache(base, widths, imageOrigins) };
}
