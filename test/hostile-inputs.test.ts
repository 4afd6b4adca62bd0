// Hostile inputs → a clear refusal at file:line: field before anything is written, or output that stays text: one row
// per case (IRIs, control characters, huge files and values, number text, JSON errors, markup and escape sequences).
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { spawnSync, type SpawnSyncReturns } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { Parser } from 'n3';
import { repoRoot, tempDir } from './helpers/fixture.js';
import { writeTinyProject } from './helpers/releases.js';
import { scanJson } from '../src/io/json-scan.js';
import { iriProblem } from '../src/io/iri.js';
import { readNumber } from '../src/io/number.js';
import { numberLiteral } from '../src/rdf/terms.js';
import { cut, SHOWN_MAX, visible } from '../src/shown.js';

const cli = path.join(repoRoot, 'dist', 'src', 'cli', 'main.js');
const run = (args: string[], shell?: string): SpawnSyncReturns<string> =>
  shell
    ? spawnSync('/bin/sh', ['-c', `${shell} && exec "$0" "$@"`, process.execPath, cli, ...args], { encoding: 'utf8' })
    : spawnSync(process.execPath, [cli, ...args], { encoding: 'utf8', maxBuffer: 1 << 26 });
const noStack = (stderr: string) => assert.doesNotMatch(stderr, /\n\s+at |node:internal|RangeError/, 'no stack trace');

/** Evidence and a decision of the tiny invented project (three archives a, b, c; works 1–9, photos p1–p9). */
const EVIDENCE = ['a:p1,b:p1,0.9,1', 'a:p2,b:p2,0.93,1', 'b:p1,c:p1,0.88,1'];
const DECISION = 'a:1,b:1,same,Jo Invented,2026-05-01,checked';

interface Row {
  name: string;
  /** Edits the project as an object (control characters in strings are written JSON-escaped, as a tool would). */
  edit?: (o: any) => void;
  /** Files to write or rewrite, relative to the project folder (a function gets the current text). */
  files?: Record<string, string | ((text: string) => string)>;
  /** Decision rows instead of the default one. */
  decisions?: string[];
  /** Expected exit of check and build; 2 also means build writes no release folder. */
  status: number;
  /** stderr of both (a refusal names file:line: field). */
  stderr?: RegExp;
  /** More checks on the built release folder (status 0) or on check's output. */
  then?: (out: string, check: SpawnSyncReturns<string>) => void;
}

const rows: Row[] = [
  {
    name: 'a curator value starting with https:// that is no IRI (a space and markup)',
    decisions: ['a:1,b:1,same,https://orcid.org/0000 <x>,2026-05-01,ok'],
    status: 2,
    stderr:
      /decisions\/curators-1\.csv:2: curator: "https:\/\/orcid\.org\/0000 <x>" starts like an IRI but is not one: a space \(U\+0020\) at character 23/,
  },
  {
    name: "a curator's ORCID IRI (kept: accepted, published as it is)",
    decisions: ['a:1,b:1,same,https://orcid.org/0000-0002-1825-0097,2026-05-01,ok'],
    status: 0,
    then: (out) =>
      assert.match(
        readFileSync(path.join(out, 'concordance.ttl'), 'utf8'),
        /<https:\/\/orcid\.org\/0000-0002-1825-0097>/,
      ),
  },
  {
    name: 'a control character (U+0001) in workIri',
    edit: (o) => (o.partners[1].workIri = 'https://b.example.org/wo\u0001rk/{work}'),
    status: 2,
    stderr: /concordance-1\.json:28: partners\[1\]\.workIri: template .* control character U\+0001 at character 25/,
  },
  {
    name: 'DEL (U+007F) in base',
    edit: (o) => (o.base = 'https://concordance.example.org/x\u007f/'),
    status: 2,
    stderr:
      /concordance-1\.json:3: base: "https:\/\/concordance\.example\.org\/x\\x7F\/" is not an absolute IRI: control character U\+007F/,
  },
  {
    name: 'an escape sequence in license',
    edit: (o) => (o.license = 'https://creativecommons.org/\u001b[31m/'),
    status: 2,
    stderr: /concordance-1\.json:4: license: "https:\/\/creativecommons\.org\/\\x1B\[31m\/" is not an absolute IRI/,
  },
  {
    name: 'NUL in recordPage',
    edit: (o) => (o.partners[2].recordPage = 'https://c.example.org/rec\u0000/{work}'),
    status: 2,
    stderr: /concordance-1\.json:\d+: partners\[2\]\.recordPage: .*control character U\+0000 at character 26/,
  },
  {
    name: 'a line break in an image-view template',
    edit: (o) => (o.partners[0].imageView = 'https://a.example.org/view/{image}\n'),
    status: 2,
    stderr: /partners\[0\]\.imageView: template .*control character U\+000A at character 35/,
  },
  {
    name: "a quote in the publisher's homepage",
    edit: (o) => (o.publisher.homepage = 'https://consortium.example.org/a"b'),
    status: 2,
    stderr:
      /publisher\.homepage: .*"\\"" \(U\+0022\) at character 33 is not allowed in an IRI|publisher\.homepage: .*U\+0022/,
  },
  {
    name: 'an https base without a host',
    edit: (o) => (o.base = 'https:///'),
    status: 2,
    stderr: /base: "https:\/\/\/" is not an absolute IRI: an https IRI needs a host/,
  },
  {
    name: 'a bidirectional override in an image template (RFC 3987 §4.1)',
    edit: (o) => (o.partners[0].imageIri = 'https://a.example.org/\u202ephoto/{image}'),
    status: 2,
    stderr: /partners\[0\]\.imageIri: .*bidirectional formatting character U\+202E/,
  },
  {
    name: 'a vocab map pattern whose own text breaks the IRI once filled with the base',
    edit: (o) => (o.vocabMap = 'map.json'),
    files: {
      'map.json': JSON.stringify({ extends: CLAIMS(), claims: [], iris: { link: '{base}link /{hash}' } }),
    },
    status: 2,
    stderr: /map\.json: iris\.link: "https:\/\/concordance\.example\.org\/link \/x" is not an absolute IRI: a space/,
  },
  {
    name: 'a vocab map predicate with a space',
    edit: (o) => (o.vocabMap = 'map.json'),
    files: {
      'map.json': JSON.stringify({
        extends: CLAIMS(),
        prefixes: { ex: 'https://vocab.example.org/' },
        claims: [{ kind: 'same', status: 'confirmed', predicate: 'ex:same as' }],
      }),
    },
    status: 2,
    stderr: /map\.json: claims: "https:\/\/vocab\.example\.org\/same as" is not an absolute IRI/,
  },
  {
    name: '150,000 repeated evidence rows (check overflowed the call stack)',
    files: { 'evidence/run-1.csv': (t) => t + 'a:p1,b:p1,0.9,1\n'.repeat(150_000) },
    status: 0,
    then: (_, check) => assert.match(check.stdout, /warnings: 1500\d\d\b/),
  },
  {
    name: 'run parameters keep their text and XSD type (1e-7, 1e21, 30 digits, 1.50, -0, 1E+3)',
    files: {
      'concordance-1.json': (t) =>
        t.replace(
          '"features": 100',
          '"features": 100, "a": 1e-7, "b": 1e21, "c": 123456789012345678901234567890, "d": 1.50, "e": -0, "f": 1E+3',
        ),
    },
    status: 0,
    then: (out) => {
      const quads = new Parser().parse(readFileSync(path.join(out, 'concordance.nq'), 'utf8'));
      const values = new Map<string, string>();
      for (const q of quads)
        if (q.predicate.value.endsWith('#parameterValue') && q.object.termType === 'Literal')
          values.set(
            q.subject.value.replace(/^.*\//, ''),
            `${q.object.value}^^${q.object.datatype.value.replace(/^.*#/, '')}`,
          );
      // XSD 1.1 Part 2: integer §3.4.13, decimal §3.3.3.1, double §3.3.5.1 lexical spaces hold each text as written.
      assert.deepEqual(Object.fromEntries([...values].sort()), {
        a: '1e-7^^double',
        b: '1e21^^double',
        c: '123456789012345678901234567890^^integer',
        d: '1.50^^decimal',
        e: '-0^^integer',
        f: '1E+3^^double',
        features: '100^^integer',
      });
    },
  },
  {
    name: 'a JSON syntax error V8 gives no position for (NaN on line 8)',
    files: { 'concordance-1.json': (t) => t.replace('"partners": [', '"partners": NaN, "x": [') },
    status: 2,
    stderr: /concordance-1\.json:8:15: JSON syntax error: expected a value .*found "N"/,
  },
  {
    name: 'a trailing comma in an array',
    files: { 'concordance-1.json': (t) => t.replace('"features": 100', '"features": [100,]') },
    status: 2,
    stderr: /concordance-1\.json:\d+:\d+: JSON syntax error: expected a value .*found "\]"/,
  },
  {
    name: 'a string opened and never closed on its line (reported where it opened)',
    files: {
      'concordance-1.json': (t) => t.replace('"title": "Tiny invented concordance"', '"title": "Tiny invented'),
    },
    status: 2,
    stderr: /concordance-1\.json:2:12: JSON syntax error: a string opened here is not closed on its line/,
  },
  {
    name: 'a JSON syntax error in a vocab map',
    edit: (o) => (o.vocabMap = 'map.json'),
    files: { 'map.json': '{\n  "claims": [],\n  "iris": { "link": "{base}link/{hash}", }\n}\n' },
    status: 2,
    stderr: /map\.json:3:42: JSON syntax error: expected a member name/,
  },
  {
    name: 'a 10 MB score value (cut in the message, not echoed whole)',
    files: { 'evidence/run-1.csv': (t) => t + `a:p3,b:p3,${'9'.repeat(10 << 20)}x,1\n` },
    status: 2,
    stderr: /run-1\.csv:5: score: score "9{150,}…\[\d+ characters cut\]…9+x" is not a number in \[0,1\]/,
    then: (_, check) => assert.ok(check.stderr.length < 1500, `stderr is ${check.stderr.length} characters`),
  },
  {
    name: 'markup and terminal escapes in catalogue values and the title (report.md and check output stay text)',
    edit: (o) => {
      o.title = 'Tiny <script>alert(1)</script> **bold** \u001b[2J';
      o.partners[0].name = 'Archive <img src=x onerror=alert(2)> | & more';
    },
    files: { 'catalogues/a.csv': (t) => t + '10,p10,Panel,\u001b]0;owned\u0007<b>soon</b>\n' },
    status: 0,
    then: (out, check) => {
      for (const text of [check.stdout, check.stderr]) assert.doesNotMatch(text, /[\u0000-\u0009\u000b-\u001f\u007f]/u);
      assert.match(check.stdout, /a\.csv:12: date: date "\\x1B\]0;owned\\x07<b>soon<\/b>" \(1 record/);
      assert.match(check.stdout, /Tiny <script>alert\(1\)<\/script> \*\*bold\*\* \\x1B\[2J/);
      const report = readFileSync(path.join(out, 'report.md'), 'utf8');
      assert.doesNotMatch(report, /[\u0000-\u0009\u000b-\u001f\u007f]/u, 'no control characters');
      assert.doesNotMatch(report, /(^|[^\\])<[a-z/]/m, 'no unescaped tag');
      assert.match(
        report,
        /^# Tiny \\<script\\>alert\(1\)\\<\/script\\> \\\*\\\*bold\\\*\\\* \\\\x1B\\\[2J: release 1$/m,
      );
      assert.match(report, /\| Archive \\<img src=x onerror=alert\(2\)\\> \\\| \\& more \|/);
    },
  },
  {
    name: 'a pixel size in hexadecimal (0x12C)',
    edit: (o) => Object.assign(o.partners[0].catalogue.columns, { width: 'w', height: 'h' }),
    files: { 'catalogues/a.csv': (t) => sized(t, '0x12C', '400') },
    status: 2,
    stderr: /a\.csv:2: w: "0x12C" is not a positive whole number of pixels \(write digits/,
  },
  {
    name: 'a pixel size with a thousands separator ("1,200")',
    edit: (o) => Object.assign(o.partners[0].catalogue.columns, { width: 'w', height: 'h' }),
    files: { 'catalogues/a.csv': (t) => sized(t, '"1,200"', '400') },
    status: 2,
    stderr:
      /a\.csv:2: w: "1,200" is not a positive whole number of pixels \(write it without a thousands separator: 1200/,
  },
  {
    name: 'pixel sizes 1e3 and 1200.0 (kept: whole numbers in the one grammar)',
    edit: (o) => Object.assign(o.partners[0].catalogue.columns, { width: 'w', height: 'h' }),
    files: { 'catalogues/a.csv': (t) => sized(t, '1e3', '1200.0') },
    status: 0,
  },
  {
    name: 'a score in hexadecimal (0x1)',
    files: { 'evidence/run-1.csv': (t) => t + 'a:p3,b:p3,0x1,1\n' },
    status: 2,
    stderr: /run-1\.csv:5: score: score "0x1" is not a number in \[0,1\] \(write digits/,
  },
  {
    name: 'a score with a decimal comma (kept: the spreadsheet hint)',
    files: { 'evidence/run-1.csv': (t) => t + 'a:p3,b:p3,"0,92",1\n' },
    status: 2,
    stderr: /run-1\.csv:5: score: score "0,92" is not a number in \[0,1\] \(write a decimal point: 0\.92\)/,
  },
  {
    name: 'a score written with an exponent (kept: 1e-1, as matchers print small numbers)',
    files: { 'evidence/run-1.csv': (t) => t + 'a:p3,b:p3,1e-1,1\n' },
    status: 0,
  },
];

/** The shipped vocab map, as a path relative to a project folder is not needed: absolute. */
function CLAIMS(): string {
  return path.join(repoRoot, 'vocab-map', 'claims.json');
}

/** A catalogue with width and height columns `w`, `h`: the first record gets `w`, `h`, the others 1200×900. */
function sized(text: string, w: string, h: string): string {
  const [head, ...lines] = text.trimEnd().split('\n');
  return [`${head},w,h`, `${lines[0]},${w},${h}`, ...lines.slice(1).map((l) => `${l},1200,900`)].join('\n') + '\n';
}

function project(row: Row): { dir: string; file: string } {
  const dir = tempDir('concordat-hostile-');
  const file = writeTinyProject(dir, {
    version: '1',
    issued: '2026-06-01',
    evidence: EVIDENCE,
    decisions: row.decisions ?? [DECISION],
  });
  if (row.edit) {
    const o = JSON.parse(readFileSync(file, 'utf8'));
    row.edit(o);
    writeFileSync(file, JSON.stringify(o, null, 2) + '\n');
  }
  for (const [rel, content] of Object.entries(row.files ?? {})) {
    const f = path.join(dir, rel);
    writeFileSync(f, typeof content === 'string' ? content : content(readFileSync(f, 'utf8')));
  }
  return { dir, file };
}

for (const row of rows)
  test(`hostile input: ${row.name}`, () => {
    const { dir, file } = project(row);
    const check = run(['check', file]);
    noStack(check.stderr);
    assert.equal(check.status, row.status, check.stderr.slice(0, 2000));
    if (row.stderr) assert.match(check.stderr, row.stderr);
    const out = path.join(dir, 'release');
    const build = run(['build', file, '--out', out]);
    noStack(build.stderr);
    assert.equal(build.status, row.status, build.stderr.slice(0, 2000));
    if (row.stderr) assert.match(build.stderr, row.stderr);
    if (row.status !== 0) assert.equal(existsSync(out), false, 'nothing written');
    row.then?.(out, check);
  });

test('hostile input: a reader that closes the pipe early (check | head) ends check without a stack trace', () => {
  const { file } = project({
    name: '',
    status: 0,
    files: { 'evidence/run-1.csv': (t) => t + 'a:p1,b:p1,0.9,1\n'.repeat(20_000) },
  });
  const r = spawnSync('/bin/sh', ['-c', '"$0" "$1" check "$2" | head -c 100 >/dev/null', process.execPath, cli, file], {
    encoding: 'utf8',
  });
  assert.equal(r.stderr, '');
});

// Reported done elsewhere (test/refusals.test.ts, test/os-errors.test.ts); confirmed here on the tiny project.
test('confirmed: validate --report refuses to overwrite the release’s own Turtle', () => {
  const { dir, file } = project({ name: '', status: 0 });
  const out = path.join(dir, 'release');
  assert.equal(run(['build', file, '--out', out]).status, 0);
  const ttl = path.join(out, 'concordance.ttl');
  const before = readFileSync(ttl);
  const r = run(['validate', ttl, '--report', ttl]);
  assert.equal(r.status, 2, r.stderr);
  assert.match(r.stderr, /--report: already exists/);
  assert.deepEqual(readFileSync(ttl), before);
});

test('confirmed: a release folder gets the mode the umask asks for (022 → 755, 027 → 750)', () => {
  for (const [umask, mode] of [
    ['022', 0o755],
    ['027', 0o750],
  ] as const) {
    const { dir, file } = project({ name: '', status: 0 });
    const out = path.join(dir, 'release');
    const r = run(['build', file, '--out', out], `umask ${umask}`);
    assert.equal(r.status, 0, r.stderr);
    assert.equal(statSync(out).mode & 0o777, mode);
  }
});

test('confirmed: init refuses an existing release folder and writes nothing into it', () => {
  const { dir, file } = project({ name: '', status: 0 });
  const out = path.join(dir, 'release');
  assert.equal(run(['build', file, '--out', out]).status, 0);
  const r = run(['init', out]);
  assert.equal(r.status, 2, r.stderr);
  assert.match(r.stderr, /is a release folder/);
  assert.equal(existsSync(path.join(out, 'concordance.json')), false);
  mkdirSync(path.join(dir, 'empty'));
  assert.equal(run(['init', path.join(dir, 'empty')]).status, 0, 'an empty folder is accepted');
});

// The helpers behind the rows, each against its published grammar.

test('the JSON scanner accepts exactly what JSON.parse accepts (RFC 8259), and places each error', () => {
  const texts: [string, number?][] = [
    ['{"a": [1, 2.5, -0, 1e-7, 1E+3, true, false, null, "x\\u00e9\\n"], "b": {}}'],
    ['  [ ]  '],
    ['"just a string"'],
    ['{"a": 1,}', 8],
    ['[1,]', 3],
    ['{"a": NaN}', 6],
    ['{"a": 01}', 6],
    ['{"a": 1.}', 6],
    ['{"a": .5}', 6],
    ['{"a": -}', 6],
    ['{"a": 1e}', 6],
    ['{"a": "x\\q"}', 8],
    ['{"a": "\\u12"}', 7],
    ['{"a": "tab\there"}', 10],
    ['{\n"a": "open\n}', 7],
    ['{"a" 1}', 5],
    ["{'a': 1}", 1],
    ['{"a": 1} x', 9],
    ['', 0],
    ['[' + '['.repeat(100_000) + ']'.repeat(100_000) + ']'],
    ['{"a": [1, 2', 11],
  ];
  for (const [text, offset] of texts) {
    let parsed = true;
    try {
      JSON.parse(text);
    } catch {
      parsed = false;
    }
    const scan = scanJson(text);
    assert.equal(scan.ok, parsed, `${text.slice(0, 40)}: scanner and JSON.parse agree`);
    if (!scan.ok) assert.equal(scan.offset, offset, `${text}: ${scan.message}`);
  }
});

test('cut keeps a long text readable: its start and end, the count cut, no half surrogate pair', () => {
  const long = '😀'.repeat(5_000_000) + ' is not a number';
  const shown = cut(long);
  assert.ok(shown.length < SHOWN_MAX + 40, `${shown.length} characters`);
  assert.ok(shown.endsWith(' is not a number'));
  assert.match(shown, /…\[\d+ characters cut\]…/);
  assert.doesNotMatch(
    shown,
    /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/,
    'no lone surrogate',
  );
  assert.equal(cut('short'), 'short');
});

test('visible shows C0, DEL, C1 and bidi controls as escapes', () => {
  assert.equal(visible('a\u001b[31mb\u0007\u007f\u009b\u202e\n'), 'a\\x1B[31mb\\x07\\x7F\\x9B\\u202E\\x0A');
});

test('iriProblem: RFC 3987 §2.2 absolute IRIs pass, anything else names its first fault', () => {
  const cases: [string, RegExp | null][] = [
    ['https://orcid.org/0000-0002-1825-0097', null],
    ['https://ex.org:8080/a/b?c=d&e#f', null],
    ['https://[::1]/x', null],
    ['https://ex.org/é/😀', null],
    ['urn:isbn:9780000000000', null],
    ['mailto:someone@example.org', null],
    ['https://ex.org/a b', /a space \(U\+0020\) at character 17/],
    ['https://ex.org/%zz', /"%" at character 16/],
    ['ex.org/a', /no scheme/],
    ['https://', /needs a host/],
    ['https://ex.org:8a/', /RFC 3987/],
    ['https://ex.org/a#b#c', /RFC 3987/],
    ['https://ex.org/{x}', /"\{" \(U\+007B\)/],
    ['https://ex.org/\u200f', /bidirectional/],
    ['https://ex.org/\ufffe', /character U\+FFFE/],
  ];
  for (const [iri, problem] of cases) {
    const p = iriProblem(iri);
    if (problem === null) assert.equal(p, null, iri);
    else assert.match(p ?? '', problem, iri);
  }
});

test('readNumber: one grammar (xsd:double lexical space without INF/NaN) for every number in a file', () => {
  const ok: [string, number][] = [
    ['0.93', 0.93],
    ['1e-5', 1e-5],
    ['.5', 0.5],
    ['+1', 1],
    ['1200.0', 1200],
  ];
  for (const [raw, value] of ok) assert.deepEqual(readNumber(raw), { ok: true, value }, raw);
  for (const raw of ['0x1', '0b1', '0o7', 'Infinity', 'NaN', 'INF', '1_000', '', ' ', '1e', '--1'])
    assert.equal(readNumber(raw).ok, false, raw);
  assert.equal(readNumber('12.5', true).ok, false, 'a whole number is asked for');
  assert.deepEqual(readNumber('1e3', true), { ok: true, value: 1000 });
});

test('numberLiteral types a JSON number by the XSD lexical space that holds its text', () => {
  const cases: [string, string][] = [
    ['12', 'integer'],
    ['-0', 'integer'],
    ['123456789012345678901234567890', 'integer'],
    ['1.50', 'decimal'],
    ['1e-7', 'double'],
    ['1E+3', 'double'],
  ];
  for (const [text, type] of cases) {
    const lit = numberLiteral(text);
    assert.equal(lit.value, text);
    assert.equal(lit.datatype.value, `http://www.w3.org/2001/XMLSchema#${type}`);
  }
});
