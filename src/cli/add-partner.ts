// `concordat add-partner <project> --key <k> --catalogue <file> [--column role=header …] [--yes]`: propose a partner
// block from an export, then write it.
import { cut, visible } from '../shown.js';
import type { Command } from 'commander';
import { projectArg } from './options.js';
import { createInterface } from 'node:readline/promises';
import { UserError } from '../errors.js';
import type { ColumnMap } from '../model.js';

const COLUMN_ROLES = ['work', 'image', 'title', 'date', 'width', 'height', 'role'] as const;

interface AddPartnerOpts {
  key: string;
  catalogue: string;
  name?: string;
  delimiter?: string;
  column: string[];
  workIri?: string;
  imageIri?: string;
  recordPage?: string;
  imageView?: string;
  yes?: boolean;
  json?: boolean;
}

async function ask(question: string): Promise<string> {
  const rl = createInterface({ input: process.stdin, output: process.stderr });
  try {
    return (await rl.question(question)).trim();
  } finally {
    rl.close();
  }
}

/** `role=header` options → a column map; an unknown role or a missing `=` names the option. */
function columnsOf(pairs: string[]): Partial<ColumnMap> {
  const out: Partial<ColumnMap> = {};
  for (const p of pairs) {
    const i = p.indexOf('=');
    const role = p.slice(0, Math.max(i, 0)).trim() as (typeof COLUMN_ROLES)[number];
    if (i <= 0 || !COLUMN_ROLES.includes(role) || !p.slice(i + 1).trim())
      throw new UserError({
        file: 'command line',
        line: 0,
        field: '--column',
        message: `"${p}" is not role=header`,
        hint: `roles: ${COLUMN_ROLES.join(', ')}; e.g. --column work="Object number"`,
      });
    out[role] = p.slice(i + 1).trim();
  }
  return out;
}

export function register(program: Command): void {
  program
    .command('add-partner')
    .description(
      'add a partner from its catalogue export: delimiter and column mapping proposed (or given), warnings for every guess, written after confirmation',
    )
    .argument('<project>', 'the project file (concordance.json), or the folder holding it', projectArg)
    .requiredOption('--key <key>', 'short partner key, e.g. harbour')
    .requiredOption('--catalogue <file>', "the partner's catalogue export (CSV or TSV with a header row)")
    .option('--name <text>', "the partner's name (default: the key)")
    .option('--delimiter <d>', "the export's column separator: , ; tab or | (default: detected from the header line)")
    .option(
      '--column <role=header>',
      `map a column yourself (repeatable); roles: ${COLUMN_ROLES.join(', ')}`,
      (v: string, all: string[]) => [...all, v],
      [] as string[],
    )
    .option(
      '--work-iri <template>',
      "the partner's own work IRI template with {work} (default: minted under the project base, with a warning; asked for on a terminal)",
    )
    .option(
      '--image-iri <template>',
      "the partner's own image IRI template with {image} (default: minted under the project base, with a warning; asked for on a terminal)",
    )
    .option('--record-page <template>', 'record page URL template with {work}')
    .option(
      '--image-view <template>',
      'URL template with {image} (and {work}) where a person can view a photograph (listed in review-queue.csv)',
    )
    .option('--yes', 'write without asking (for scripts); warnings are still printed')
    .option(
      '--json',
      'print the proposal (block, reasons, warnings, notes, written) as JSON on stdout; without --yes nothing is written and nothing asked',
    )
    .addHelpText(
      'after',
      '\nExamples:\n  concordat add-partner concordance.json --key harbour --catalogue catalogues/harbour.tsv --name "Harbour Institute"\n  concordat add-partner concordance.json --key quay --catalogue exports/quay.txt --delimiter "|" --column work=OBJ --column image=NEG \\\n      --work-iri "https://quay.example.org/id/object/{work}" --image-iri "https://quay.example.org/id/negative/{image}" --yes\n\nExit codes: 0 written (or, with --json and no --yes, proposed), 1 not confirmed, 2 bad input (or no terminal to ask and no --yes).',
    )
    .action(async (project: string, opts: AddPartnerOpts) => {
      const { proposePartner, writePartner, describeProposal } = await import('../setup/partner.js');
      const interactive = !opts.yes && !opts.json && process.stdin.isTTY;
      const templates = { workIri: opts.workIri, imageIri: opts.imageIri };
      if (interactive) {
        process.stderr.write(
          "The partner's own IRIs for its records and photographs keep links stable where the partner publishes them.\n",
        );
        for (const [k, v, what] of [
          ['workIri', 'work', 'records'],
          ['imageIri', 'image', 'photographs'],
        ] as const)
          if (templates[k] === undefined)
            templates[k] =
              (await ask(
                `IRI template for the partner's ${what}, with {${v}} (Enter: mint them under the project base): `,
              )) || undefined;
      }
      const p = await proposePartner(project, {
        key: opts.key,
        catalogue: opts.catalogue,
        name: opts.name,
        delimiter: opts.delimiter,
        columns: columnsOf(opts.column),
        ...templates,
        recordPage: opts.recordPage,
        imageView: opts.imageView,
      });
      for (const w of p.warnings) process.stderr.write(`warning: ${visible(cut(w))}\n`);
      if (opts.json) {
        if (opts.yes) writePartner(p);
        process.stdout.write(
          JSON.stringify(
            {
              projectFile: project,
              block: p.block,
              reasons: p.reasons,
              warnings: p.warnings,
              notes: p.notes,
              written: !!opts.yes,
            },
            null,
            2,
          ) + '\n',
        );
        return;
      }
      process.stdout.write(describeProposal(p));
      if (!opts.yes) {
        if (!process.stdin.isTTY)
          throw new UserError({
            file: project,
            line: 0,
            field: '--yes',
            message: 'not written: no terminal to confirm on',
            hint: 'check the proposal above and rerun with --yes',
          });
        if (!/^y(es)?$/i.test(await ask(`Add partner "${opts.key}" to ${project}? [y/N] `))) {
          throw new UserError(
            {
              file: project,
              line: 0,
              field: '',
              message: 'not written',
              hint: 'correct the proposal with --delimiter, --column, --name, --work-iri, --image-iri',
            },
            1,
          );
        }
      }
      writePartner(p);
      process.stdout.write(`partner "${opts.key}" added to ${project}\n`);
    });
}
