// `concordat validate <files...>`: options → SHACL validation of RDF files, printed summary and exit code.
import { Option, type Command } from 'commander';
import type { ShaclEngine } from '../validate/shacl.js';
import { EXIT, UserError } from '../errors.js';

const EXAMPLE = `
Exit status: 0 when no result has severity sh:Violation (warnings and infos are listed but pass),
1 when any does, 2 when a file or the shapes folder cannot be read or parsed.

Example:
  $ concordat validate release/concordance.nq release/dataset.ttl --report release/validation.ttl
`;

/** Registers `validate` (SHACL §3 validation of Turtle, N-Triples, N-Quads, TriG or JSON-LD files). */
export function register(program: Command): void {
  program
    .command('validate')
    .description('check RDF files (.ttl .nt .nq .trig .jsonld) against the SHACL shapes')
    .argument('<files...>', 'RDF files to check; all are merged into one data graph')
    .option(
      '--shapes <folder>',
      'folder whose .ttl files hold the SHACL shapes (default: the shapes/ folder shipped with concordat)',
    )
    .option('--report <file>', 'also write the SHACL validation report as Turtle to this file')
    .addOption(
      new Option('--shacl-engine <name>', 'SHACL engine: the built-in SHACL core engine, or rdf-validate-shacl')
        .choices(['builtin', 'rdf-validate-shacl'])
        .default('builtin'),
    )
    .option('--json', 'print the outcome as JSON instead of text')
    .addHelpText('after', EXAMPLE)
    .action(
      async (files: string[], opts: { shapes?: string; report?: string; json?: boolean; shaclEngine: ShaclEngine }) => {
        const { defaultShapesDir, streamDataFiles, loadShapesFolder } = await import('../validate/files.js');
        const { BoundedValidation } = await import('../validate/bounded.js');
        const { writeValidationReport } = await import('../validate/report.js');
        const { summaryJson, summaryText } = await import('../validate/summary.js');
        const { existsSync } = await import('node:fs');
        if (opts.report && existsSync(opts.report))
          // never overwrite a file (a release's own Turtle included)
          throw new UserError({
            file: opts.report,
            line: 0,
            field: '--report',
            message: 'already exists',
            hint: 'give a new file name; an existing file is never overwritten',
          });
        const shapes = await loadShapesFolder(opts.shapes ?? defaultShapesDir());
        const run = new BoundedValidation(shapes.quads, {
          shapesLabel: opts.shapes ?? 'shapes',
          engine: opts.shaclEngine,
          dataLabel: files.join(' '),
        });
        try {
          await streamDataFiles(files, (q) => run.add(q));
        } catch (err) {
          run.cleanup();
          throw err;
        }
        const outcome = await run.finish();
        if (opts.report) await writeValidationReport(opts.report, outcome);
        const context = { files: files.length, quads: outcome.triples, shapesFiles: shapes.files.length };
        process.stdout.write(
          opts.json ? JSON.stringify(summaryJson(outcome, context), null, 2) + '\n' : summaryText(outcome, context),
        );
        process.exitCode = outcome.conforms ? EXIT.ok : EXIT.failure;
      },
    );
}
