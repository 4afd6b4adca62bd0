// `concordat build <project> --out <folder>`: the whole pipeline into a new release folder.
import { Option, type Command } from 'commander';
import { projectArg } from './options.js';
import type { ShaclEngine } from '../validate/shacl.js';
import { displayPath, formatProblem } from '../errors.js';
import { placeholderWarnings } from '../load/placeholders.js';

export function register(program: Command): void {
  program
    .command('build')
    .description('build a release: claims, clusters, reports and validated RDF dumps, into a new folder')
    .argument('<project>', 'the project file, e.g. demo-data/concordance.json, or the folder holding it', projectArg)
    .requiredOption('--out <folder>', 'the release folder to create (must not exist)')
    .option('--shapes <folder>', 'SHACL shapes to validate against (default: the shapes shipped with concordat)')
    .option('--previous <folder>', 'the previous release folder (overrides "previous" in the project file)')
    .addOption(
      new Option('--shacl-engine <name>', 'SHACL engine: the built-in SHACL core engine, or rdf-validate-shacl')
        .choices(['builtin', 'rdf-validate-shacl'])
        .default('builtin'),
    )
    .option(
      '--csv-plain',
      'write review-queue.csv, conflicts.csv and clusters.csv with LF and no BOM (default: for spreadsheets, UTF-8 with BOM and CRLF)',
    )
    .option('--gzip', 'also write every dump gzip-compressed (concordance.nq.gz, …; project setting release.compress)')
    .option('--json', 'print the summary as JSON on stdout')
    .addHelpText(
      'after',
      '\nExample:\n  concordat build demo-data/concordance.json --out releases/2026.1\n\nExit codes: 0 built, 1 the release does not conform to the shapes (nothing written), 2 bad input or the folder exists.',
    )
    .action(
      async (
        project: string,
        opts: {
          out: string;
          shapes?: string;
          json?: boolean;
          previous?: string;
          shaclEngine: ShaclEngine;
          csvPlain?: boolean;
          gzip?: boolean;
        },
      ) => {
        const progress = process.stderr.isTTY ? (s: string) => process.stderr.write(`concordat: ${s}…\n`) : undefined;
        const { build } = await import('../pipeline.js'); // loaded on use: keeps --help fast
        const { releaseSummary, releaseSummaryText } = await import('./build-summary.js');
        const r = await build(project, opts.out, {
          shapesDir: opts.shapes,
          progress,
          previous: opts.previous,
          shaclEngine: opts.shaclEngine,
          csvPlain: opts.csvPlain,
          gzip: opts.gzip,
        });
        // What a starter leaves unfilled is published as it stands: say so on every build, not only in `check`.
        const unfilled = placeholderWarnings(r.model.project, project);
        for (const w of unfilled) process.stderr.write(`concordat: warning: ${formatProblem(w)}\n`);
        const others = r.model.warnings.length - unfilled.length;
        if (others > 0)
          process.stderr.write(
            `concordat: ${others}${unfilled.length ? ' more' : ''} warning(s) about the inputs; \`concordat check\` lists them\n`,
          );
        const s = releaseSummary(r);
        process.stdout.write(
          opts.json ? JSON.stringify(s, null, 2) + '\n' : releaseSummaryText(s, displayPath(r.outDir)),
        );
      },
    );
}
