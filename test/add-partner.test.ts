// add-partner from the command line: delimiter and columns given or guessed, a warning for every guess from values
// alone and for IRIs minted under the consortium's base, notes on unmapped columns; check flags a starter's
// placeholders.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { repoRoot, tempDir } from './helpers/fixture.js';

const cli = path.join(repoRoot, 'dist', 'src', 'cli', 'main.js');
const run = (...args: string[]) => spawnSync(process.execPath, [cli, ...args], { encoding: 'utf8', cwd: repoRoot });

/** A fresh starter project with one export written into its catalogues/ folder. */
function project(exportName: string, text: string): { file: string; exportFile: string } {
  const dir = tempDir('concordat-partner-');
  assert.equal(run('init', dir).status, 0);
  const exportFile = path.join(dir, 'catalogues', exportName);
  writeFileSync(exportFile, text);
  return { file: path.join(dir, 'concordance.json'), exportFile };
}

/** An export whose headers no vocabulary knows, separated by "|". */
const PIPES =
  [
    'OBJ|NEG|BESCHR|ANNO',
    'K-1|N-1-a|Heilige Familie im Stall|um 1480',
    'K-1|N-1-b|Heilige Familie im Stall|um 1480',
    'K-2|N-2-a|Kreuzigung mit Stifter|1502',
  ].join('\n') + '\n';

test('a "|"-separated export with unknown headers: a wrong --delimiter is refused with a hint, then added with --delimiter and --column', () => {
  const p = project('quay.txt', PIPES);
  const wrong = run('add-partner', p.file, '--key', 'quay', '--catalogue', p.exportFile, '--delimiter', ';', '--yes');
  assert.equal(wrong.status, 2);
  assert.match(
    wrong.stderr,
    /work: no column looks like the work ID \(name it: --column work=<header>; the header \(delimiter ";"\) has: OBJ\|NEG\|BESCHR\|ANNO \(one column: give --delimiter\)\)/,
  );
  const r = run(
    'add-partner',
    p.file,
    '--key',
    'quay',
    '--catalogue',
    p.exportFile,
    '--delimiter',
    '|',
    '--column',
    'work=OBJ',
    '--column',
    'image=NEG',
    '--column',
    'date=ANNO',
    '--work-iri',
    'https://quay.example.org/id/object/{work}',
    '--image-iri',
    'https://quay.example.org/id/negative/{image}',
    '--yes',
  );
  assert.equal(r.status, 0, r.stderr);
  const block = JSON.parse(readFileSync(p.file, 'utf8')).partners[0];
  assert.equal(block.catalogue.delimiter, '|');
  assert.equal(block.catalogue.columns.work, 'OBJ');
  assert.equal(block.catalogue.columns.image, 'NEG');
  assert.equal(block.catalogue.columns.date, 'ANNO');
  assert.equal(block.workIri, 'https://quay.example.org/id/object/{work}');
  assert.doesNotMatch(r.stderr, /minted under the consortium's base/, "the partner's own templates: no warning");
});

test('every guess from values alone is a warning, even with --yes; IRIs minted under the base are a warning', () => {
  const p = project('x.csv', PIPES.replace(/\|/g, ','));
  const r = run('add-partner', p.file, '--key', 'x', '--catalogue', p.exportFile, '--yes');
  assert.equal(r.status, 0, r.stderr);
  const block = JSON.parse(readFileSync(p.file, 'utf8')).partners[0];
  for (const role of ['work', 'image', 'date']) {
    assert.ok(block.catalogue.columns[role], `${role} was guessed`);
    assert.match(
      r.stderr,
      new RegExp(`warning: ${role} ← "${block.catalogue.columns[role]}" was guessed from its values alone`),
      role,
    );
  }
  assert.match(
    r.stderr,
    /warning: work IRIs are minted under the consortium's base https:\/\/concordance\.example\.org\/.*--work-iri/,
  );
  assert.match(r.stderr, /warning: image IRIs are minted under the consortium's base/);
  assert.equal(block.catalogue.columns.title, undefined, 'no header or value says title clearly enough');
  assert.match(r.stdout, /note: no column looks like the title/);
});

test('columns that look like a role but stay unmapped are noted; a --column naming no header is refused with a near miss', () => {
  const csv =
    [
      'Inventarnummer;Aufnahme;Titel;Datierung;Bemerkung',
      'A 1;F 1;Madonna mit Kind;um 1470;Rahmen neu',
      'A 2;F 2;Kreuzigung;1502;',
    ].join('\r\n') + '\r\n';
  const p = project('k.csv', csv);
  const r = run(
    'add-partner',
    p.file,
    '--key',
    'k',
    '--catalogue',
    p.exportFile,
    '--column',
    'date=Bemerkung',
    '--json',
  );
  assert.equal(r.status, 0, r.stderr);
  const j = JSON.parse(r.stdout);
  assert.equal(j.written, false, '--json without --yes writes nothing');
  assert.equal(JSON.parse(readFileSync(p.file, 'utf8')).partners.length, 0);
  assert.equal(j.block.catalogue.columns.date, 'Bemerkung');
  assert.equal(j.reasons.date, 'set with --column');
  assert.ok(
    j.notes.some((n: string) =>
      /^column "Datierung" looks like the date .* but is not mapped: --column date="Datierung" maps it$/.test(n),
    ),
    j.notes.join('\n'),
  );
  const bad = run('add-partner', p.file, '--key', 'k', '--catalogue', p.exportFile, '--column', 'title=Titl', '--yes');
  assert.equal(bad.status, 2);
  assert.match(bad.stderr, /--column title: no column "Titl" in the header \(did you mean "Titel"\?/);
  const role = run(
    'add-partner',
    p.file,
    '--key',
    'k',
    '--catalogue',
    p.exportFile,
    '--column',
    'colour=Titel',
    '--yes',
  );
  assert.equal(role.status, 2);
  assert.match(role.stderr, /--column: "colour=Titel" is not role=header/);
});

test('an export without title or date columns gets a note for each', () => {
  const p = project('n.csv', 'Object number,Photo number\nA 1,P 1\nA 1,P 2\nA 2,P 3\n');
  const j = JSON.parse(run('add-partner', p.file, '--key', 'n', '--catalogue', p.exportFile, '--json').stdout);
  assert.ok(j.notes.some((n: string) => /^no column looks like the title/.test(n)));
  assert.ok(
    j.notes.some((n: string) => /^no column looks like the date: without it date conflicts cannot be found/.test(n)),
  );
});

test("check flags a starter project's placeholder publisher and licence until they are filled in", () => {
  const p = project('n.csv', 'Object number,Photo number,Title\nA 1,P 1,Madonna\nA 2,P 2,Saint\n');
  assert.equal(run('add-partner', p.file, '--key', 'n', '--catalogue', p.exportFile, '--yes').status, 0);
  const r = run('check', p.file, '--json');
  assert.equal(r.status, 0, r.stderr);
  const fields = JSON.parse(r.stdout).warnings.map((w: { field: string }) => w.field);
  assert.ok(fields.includes('publisher.name') && fields.includes('license'), fields.join(', '));
  const o = JSON.parse(readFileSync(p.file, 'utf8'));
  o.publisher.name = 'Invented Consortium of Photo Archives';
  o.license = 'https://creativecommons.org/licenses/by/4.0/';
  writeFileSync(p.file, JSON.stringify(o, null, 2));
  const after = JSON.parse(run('check', p.file, '--json').stdout).warnings.map((w: { field: string }) => w.field);
  assert.ok(!after.includes('publisher.name') && !after.includes('license'), after.join(', '));
});

test("the starter's placeholder base: add-partner warns, check flags it and every partner template under it, build repeats it", () => {
  const p = project('n.csv', 'Object number,Photo number,Title\nA 1,P 1,Madonna\nA 2,P 2,Saint\n');
  const added = run('add-partner', p.file, '--key', 'n', '--catalogue', p.exportFile, '--yes', '--json');
  assert.equal(added.status, 0, added.stderr);
  assert.ok(
    JSON.parse(added.stdout).warnings.some((w: string) => /base is still the starter's placeholder/.test(w)),
    added.stdout,
  );
  const fields = () =>
    JSON.parse(run('check', p.file, '--json').stdout).warnings.map((w: { field: string }) => w.field) as string[];
  const before = fields();
  for (const f of ['base', 'partners[0].workIri', 'partners[0].imageIri'])
    assert.ok(before.includes(f), `${f} missing from ${before.join(', ')}`);
  const out = path.join(tempDir('concordat-placeholder-out-'), 'r');
  const built = run('build', p.file, '--out', out);
  assert.equal(built.status, 0, built.stderr);
  assert.match(
    built.stderr,
    /warning: .*concordance\.json:\d+: base: the base https:\/\/concordance\.example\.org\/ is still/,
  );
  assert.match(built.stderr, /warning: .*partners\[0\]\.workIri: workIri of partner "n" is minted under/);
  const o = JSON.parse(readFileSync(p.file, 'utf8'));
  o.base = 'https://concordance.invented-consortium.test/';
  o.partners[0].workIri = 'https://collection.invented-archive.test/work/{work}';
  o.partners[0].imageIri = 'https://collection.invented-archive.test/photo/{image}';
  writeFileSync(p.file, JSON.stringify(o, null, 2));
  const after = fields();
  assert.ok(!after.some((f) => f === 'base' || f.startsWith('partners[')), after.join(', '));
  // under the real base: minted by the consortium, and the site does not answer them
  o.partners[0].workIri = 'https://concordance.invented-consortium.test/id/n/work/{work}';
  writeFileSync(p.file, JSON.stringify(o, null, 2));
  const under = JSON.parse(run('check', p.file, '--json').stdout).warnings;
  assert.ok(
    under.some(
      (w: { field: string; message: string }) =>
        w.field === 'partners[0].workIri' && /concordat site` does not answer them/.test(w.message),
    ),
    JSON.stringify(under),
  );
});
