// Every command on damaged inputs (project file, catalogue, evidence, decisions, gold, vocab map, shapes, release,
// store and site folders: truncated, empty, binary junk, wrong types, missing keys, a folder where a file belongs,
// missing): a user-error exit, a message naming the file with a hint, no stack trace, and nothing left behind.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { spawn, spawnSync } from 'node:child_process';
import { cpSync, mkdirSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fixtures, repoRoot, tempDir } from './helpers/fixture.js';

const cli = path.join(repoRoot, 'dist', 'src', 'cli', 'main.js');
const root = tempDir('concordat-damaged-');
const world = path.join(root, 'world');

/** The intact inputs every case starts from: a project, its release, a store holding it, a site of it. */
const ready = (() => {
  cpSync(path.join(fixtures, 'load', 'base'), path.join(world, 'project'), { recursive: true });
  cpSync(path.join(repoRoot, 'vocab-map'), path.join(world, 'project', 'vocab-map'), { recursive: true });
  cpSync(path.join(repoRoot, 'shapes'), path.join(world, 'shapes'), { recursive: true });
  const projectFile = path.join(world, 'project', 'concordance.json');
  const project = JSON.parse(readFileSync(projectFile, 'utf8'));
  writeFileSync(projectFile, JSON.stringify({ ...project, vocabMap: 'vocab-map/claims.json' }, null, 2));
  const steps = [
    ['build', projectFile, '--out', path.join(world, 'release')],
    ['build', projectFile, '--out', path.join(world, 'release-b')],
    ['load', path.join(world, 'release'), '--store', path.join(world, 'store')],
    ['site', path.join(world, 'release'), '--out', path.join(world, 'site')],
  ];
  for (const args of steps) {
    const r = spawnSync(process.execPath, [cli, ...args], { encoding: 'utf8' });
    assert.equal(r.status, 0, `${args.join(' ')}: ${r.stderr}`);
  }
  return true;
})();

/** Deterministic junk: every byte value (NUL and invalid UTF-8 included) in a scrambled order, twice. */
const JUNK = Buffer.from(Array.from({ length: 512 }, (_, i) => (i * 167 + 13) % 256));

type Damage = (file: string) => void;
const rewriteJson =
  (edit: (o: Record<string, unknown>) => unknown): Damage =>
  (f) =>
    writeFileSync(f, JSON.stringify(edit(JSON.parse(readFileSync(f, 'utf8'))), null, 2));
const without =
  (...keys: string[]): Damage =>
  (f) =>
    rewriteJson((o) => Object.fromEntries(Object.entries(o).filter(([k]) => !keys.includes(k))))(f);

/** Damages that suit any file. */
const ANY: Record<string, Damage> = {
  truncated: (f) => writeFileSync(f, readFileSync(f).subarray(0, Math.floor(statSync(f).size / 2))),
  empty: (f) => writeFileSync(f, ''),
  'binary junk': (f) => writeFileSync(f, JUNK),
  'a folder instead': (f) => {
    rmSync(f, { recursive: true });
    mkdirSync(f);
  },
  missing: (f) => rmSync(f, { recursive: true }),
};
/** Damages of a CSV file with a header row: a renamed column, a header only, a number column with text. */
const CSV: Record<string, Damage> = {
  'missing column': (f) => writeFileSync(f, readFileSync(f, 'utf8').replace(/^[^,\t\n]+/, 'Renamed')),
  'header only': (f) => writeFileSync(f, readFileSync(f, 'utf8').split('\n')[0] + '\n'),
  'only a header of junk': (f) => writeFileSync(f, '\u0000\u0001\n'),
};

const P = (d: string) => path.join(d, 'project', 'concordance.json');
const out = (d: string) => path.join(d, 'out');
/** Commands that read a project and what it names. */
const PROJECT_COMMANDS: Record<string, (d: string) => string[]> = {
  check: (d) => ['check', P(d)],
  build: (d) => ['build', P(d), '--out', out(d)],
  sweep: (d) => ['sweep', P(d)],
};

interface Target {
  /** What is damaged, relative to the case folder. */
  file: string;
  damages: Record<string, Damage>;
  commands: Record<string, (d: string) => string[]>;
  /** Other files a message may name first (a file whose references break when this one is cut). */
  alsoNamed?: string[];
  /** `command/damage` → why that command rightly accepts that damage (the test then expects exit 0). */
  accepted?: Record<string, string>;
}

const targets: Target[] = [
  {
    file: 'project/concordance.json',
    damages: {
      ...ANY,
      'wrong types': rewriteJson((o) => ({ ...o, partners: 'alpha, beta', policy: [0.5] })),
      'top level an array': rewriteJson((o) => [o]),
      'missing keys': without('partners', 'base'),
      'a partner without its catalogue': rewriteJson((o) => ({
        ...o,
        partners: (o.partners as Record<string, unknown>[]).map((p, i) => (i ? p : { ...p, catalogue: undefined })),
      })),
    },
    commands: {
      ...PROJECT_COMMANDS,
      'add-partner': (d) => [
        'add-partner',
        P(d),
        '--key',
        'gamma',
        '--catalogue',
        path.join(d, 'project', 'catalogues', 'alpha.csv'),
        '--yes',
      ],
    },
  },
  {
    file: 'project/catalogues/alpha.csv',
    damages: { ...ANY, ...CSV },
    alsoNamed: ['run1.csv', 'd.csv', 'gold.csv'],
    accepted: {
      'add-partner/missing column': 'a column is recognised from its values when its header says nothing (a warning)',
      'add-partner/truncated': 'it reads the header and first rows to propose columns; check reads every row later',
    },
    commands: {
      ...PROJECT_COMMANDS,
      'add-partner': (d) => [
        'add-partner',
        P(d),
        '--key',
        'gamma',
        '--catalogue',
        path.join(d, 'project', 'catalogues', 'alpha.csv'),
        '--yes',
      ],
    },
  },
  {
    file: 'project/catalogues/beta.tsv',
    damages: ANY,
    commands: { check: PROJECT_COMMANDS.check },
    alsoNamed: ['run1.csv', 'd.csv', 'gold.csv'],
  },
  { file: 'project/evidence/run1.csv', damages: { ...ANY, ...CSV }, commands: PROJECT_COMMANDS },
  { file: 'project/decisions/d.csv', damages: { ...ANY, ...CSV }, commands: PROJECT_COMMANDS },
  { file: 'project/gold/gold.csv', damages: { ...ANY, ...CSV }, commands: { check: PROJECT_COMMANDS.check } },
  {
    file: 'project/vocab-map/claims.json',
    damages: {
      ...ANY,
      'wrong types': rewriteJson((o) => ({ ...o, prefixes: ['owl'] })),
      'missing keys': without('prefixes'),
    },
    commands: { check: PROJECT_COMMANDS.check, build: PROJECT_COMMANDS.build },
  },
  {
    file: 'shapes/concordat.ttl',
    damages: {
      truncated: ANY.truncated,
      'binary junk': ANY['binary junk'],
      'a folder instead': ANY['a folder instead'],
    },
    commands: {
      build: (d) => ['build', P(d), '--out', out(d), '--shapes', path.join(d, 'shapes')],
      validate: (d) => ['validate', path.join(d, 'release', 'concordance.ttl'), '--shapes', path.join(d, 'shapes')],
    },
  },
  {
    file: 'release/concordance.nq',
    damages: ANY,
    commands: {
      load: (d) => ['load', path.join(d, 'release'), '--store', path.join(d, 'store-new')],
      site: (d) => ['site', path.join(d, 'release'), '--out', out(d)],
      diff: (d) => ['diff', path.join(d, 'release'), path.join(d, 'release-b')],
      cite: (d) => ['cite', 'alpha:A 1', '--release', path.join(d, 'release')],
    },
  },
  {
    file: 'release/concordance.ttl',
    damages: ANY,
    commands: { validate: (d) => ['validate', path.join(d, 'release', 'concordance.ttl')] },
    accepted: {
      'validate/empty': 'an empty file is a Turtle document of no triples (RDF 1.1 Turtle §2), which conforms',
    },
  },
  {
    file: 'release/SHA256SUMS',
    damages: ANY,
    commands: { load: (d) => ['load', path.join(d, 'release'), '--store', path.join(d, 'store-new')] },
  },
  {
    file: 'release/report.json',
    damages: { ...ANY, 'wrong types': rewriteJson(() => ({ links: 'many', clusters: null })) },
    commands: {
      'build --previous': (d) => ['build', P(d), '--out', out(d), '--previous', path.join(d, 'release')],
    },
  },
  {
    file: 'store/manifest.json',
    damages: { ...ANY, 'wrong types': rewriteJson(() => ({ version: 'one', graphs: [] })) },
    commands: {
      query: (d) => ['query', 'ASK { ?s ?p ?o }', '--store', path.join(d, 'store')],
      cite: (d) => ['cite', 'alpha:A 1', '--store', path.join(d, 'store')],
      load: (d) => ['load', path.join(d, 'release'), '--store', path.join(d, 'store')],
    },
    accepted: {
      'load/missing':
        'a store folder without manifest.json is an empty store; its graph files are leftovers, removed and named',
    },
  },
];

/** Every file and folder under `dir` with its size (or `dir`): what a failed command may not change. */
function listing(dir: string): string[] {
  const out: string[] = [];
  const walk = (d: string): void => {
    for (const name of readdirSync(d).sort()) {
      const p = path.join(d, name);
      const s = statSync(p, { throwIfNoEntry: false });
      out.push(`${path.relative(dir, p)} ${s?.isDirectory() ? 'dir' : s?.size}`);
      if (s?.isDirectory()) walk(p);
    }
  };
  walk(dir);
  return out;
}

/** A stack frame, an error class name at the start of a line, or Node's own crash report. */
const CRASH = /^\s+at |^(TypeError|RangeError|ReferenceError|SyntaxError|Error)\b|node:internal|Node\.js v\d+/m;

interface Outcome {
  status: number | null;
  stderr: string;
  stdout: string;
}

/** Runs the CLI with its temp folder inside the case folder; kills it after 60 s (a server that started). */
function run(args: string[], dir: string): Promise<Outcome> {
  return new Promise((resolve) => {
    const tmp = path.join(dir, 'tmp');
    mkdirSync(tmp, { recursive: true });
    const child = spawn(process.execPath, [cli, ...args], { env: { ...process.env, TMPDIR: tmp } });
    let stderr = '';
    let stdout = '';
    child.stderr.on('data', (d) => (stderr += d));
    child.stdout.on('data', (d) => (stdout += d));
    const timer = setTimeout(() => child.kill('SIGKILL'), 60_000);
    child.on('close', (status) => {
      clearTimeout(timer);
      resolve({ status, stderr, stdout });
    });
  });
}

/** Checks one outcome: exit 2, no crash, the damaged file (or its folder) named in a message with a hint. */
function assertClear(r: Outcome, file: string, label: string, alsoNamed: string[] = []): void {
  assert.equal(r.status, 2, `${label}: exit ${r.status}\n${r.stderr}`);
  assert.doesNotMatch(r.stderr, CRASH, `${label}: a crash\n${r.stderr}`);
  // warnings printed before the refusal (add-partner's guesses) are not the message
  const lines = r.stderr
    .trim()
    .split('\n')
    .filter((l) => !l.startsWith('warning: '));
  const named = [path.basename(file), path.basename(path.dirname(file)), ...alsoNamed];
  assert.ok(
    named.some((n) => lines[0].includes(n)),
    `${label}: the first line names neither ${named.join(' nor ')}\n${r.stderr}`,
  );
  assert.match(lines[0], /\(.+\)$/, `${label}: no hint in the first line\n${r.stderr}`);
}

let caseNo = 0;
for (const t of targets) {
  const cases = Object.entries(t.damages).flatMap(([damage, apply]) =>
    Object.entries(t.commands).map(([command, args]) => ({ damage, apply, command, args })),
  );
  test(`${t.file} damaged ${cases.length} ways, under ${Object.keys(t.commands).join(', ')}: exit 2, the file named with a hint, no stack trace, nothing left`, async () => {
    assert.ok(ready);
    const failures: string[] = [];
    const one = async (c: (typeof cases)[number]): Promise<void> => {
      const dir = path.join(root, `case-${caseNo++}`);
      cpSync(world, dir, { recursive: true });
      c.apply(path.join(dir, t.file));
      mkdirSync(path.join(dir, 'tmp'));
      const before = listing(dir);
      const r = await run(c.args(dir), dir);
      const label = `${c.command} with ${t.file} ${c.damage}`;
      try {
        const accepted = t.accepted?.[`${c.command}/${c.damage}`];
        if (accepted) {
          assert.equal(r.status, 0, `${label} is accepted (${accepted}): exit ${r.status}\n${r.stderr}`);
          return;
        }
        assertClear(r, path.join(dir, t.file), label, t.alsoNamed);
        rmSync(path.join(dir, 'tmp'), { recursive: true, force: false });
        mkdirSync(path.join(dir, 'tmp'));
        const after = listing(dir);
        const changed = [...after.filter((l) => !before.includes(l)), ...before.filter((l) => !after.includes(l))];
        assert.deepEqual(changed, [], `${label}: files left behind or changed`);
      } catch (err) {
        failures.push(
          `${(err as Error).message.split('\n').slice(0, 6).join('\n')}\n  stderr: ${r.stderr.slice(0, 300)}`,
        );
      }
      rmSync(dir, { recursive: true, force: true });
    };
    // two at a time: the machine's two cores
    for (let i = 0; i < cases.length; i += 2) await Promise.all(cases.slice(i, i + 2).map(one));
    assert.deepEqual(failures, [], `${failures.length} of ${cases.length} cases:\n\n${failures.join('\n\n')}`);
  });
}

test('serve on a damaged site folder does not start: exit 2, the file named, no stack trace', async () => {
  assert.ok(ready);
  const failures: string[] = [];
  const manifest = 'site.json';
  const damages = { ...ANY, 'wrong types': rewriteJson((o) => ({ ...o, widths: 'wide' })) };
  for (const [damage, apply] of Object.entries(damages)) {
    const dir = path.join(root, `serve-${damage.replace(/\W/g, '-')}`);
    cpSync(world, dir, { recursive: true });
    apply(path.join(dir, 'site', manifest!));
    const r = await run(['serve', path.join(dir, 'site'), '--port', '0'], dir);
    try {
      assertClear(r, path.join(dir, 'site', manifest!), `serve with the site's ${manifest} ${damage}`);
    } catch (err) {
      failures.push((err as Error).message.split('\n').slice(0, 8).join('\n'));
    }
  }
  assert.deepEqual(failures, [], failures.join('\n\n'));
});

test('init where a file stands in the path: exit 2, the path named, no stack trace, nothing made', async () => {
  const dir = tempDir('concordat-damaged-init-');
  writeFileSync(path.join(dir, 'file'), 'x');
  mkdirSync(path.join(dir, 'tmp'));
  const before = listing(dir);
  const r = await run(['init', path.join(dir, 'file', 'project')], dir);
  assertClear(r, path.join(dir, 'file', 'project'), 'init under a file');
  rmSync(path.join(dir, 'tmp'), { recursive: true });
  mkdirSync(path.join(dir, 'tmp'));
  assert.deepEqual(listing(dir), before);
});
