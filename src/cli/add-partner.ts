// `concordat add-partner <project> --key <k> --catalogue <file> [--yes]`: propose a partner block from an export, then write it.
import type { Command } from 'commander';
import { createInterface } from 'node:readline/promises';
import { UserError } from '../errors.js';

async function confirm(question: string): Promise<boolean> {
  const rl = createInterface({ input: process.stdin, output: process.stderr });
  try {
    return /^y(es)?$/i.test((await rl.question(question)).trim());
  } finally {
    rl.close();
  }
}

export function register(program: Command): void {
  program
    .command('add-partner')
    .description('add a partner from its catalogue export: sniff the delimiter, propose the column mapping, write the block after confirmation')
    .argument('<project>', 'the project file (concordance.json)')
    .requiredOption('--key <key>', 'short partner key, e.g. harbour')
    .requiredOption('--catalogue <file>', 'the partner\'s catalogue export (CSV or TSV with a header row)')
    .option('--name <text>', 'the partner\'s name (default: the key)')
    .option('--work-iri <template>', 'work IRI template with {work} (default: under the project base)')
    .option('--image-iri <template>', 'image IRI template with {image} (default: under the project base)')
    .option('--yes', 'write without asking (for scripts)')
    .addHelpText('after', '\nExample:\n  concordat add-partner concordance.json --key harbour --catalogue catalogues/harbour.tsv --name "Harbour Institute"\n\nExit codes: 0 written, 1 not confirmed, 2 bad input (or no terminal to ask and no --yes).')
    .action(async (project: string, opts: { key: string; catalogue: string; name?: string; workIri?: string; imageIri?: string; yes?: boolean }) => {
      const { proposePartner, writePartner, describeProposal } = await import('../setup/partner.js');
      const p = await proposePartner(project, { key: opts.key, catalogue: opts.catalogue, name: opts.name, workIri: opts.workIri, imageIri: opts.imageIri });
      process.stdout.write(describeProposal(p));
      if (!opts.yes) {
        if (!process.stdin.isTTY) throw new UserError({ file: project, line: 0, field: '--yes', message: 'not written: no terminal to confirm on', hint: 'check the proposal above and rerun with --yes' });
        if (!(await confirm(`Add partner "${opts.key}" to ${project}? [y/N] `))) {
          throw new UserError({ file: project, line: 0, field: '', message: 'not written', hint: 'edit the proposal with --name, --work-iri, --image-iri, or add the block by hand' }, 1);
        }
      }
      writePartner(p);
      process.stdout.write(`partner "${opts.key}" added to ${project}\n`);
    });
}
