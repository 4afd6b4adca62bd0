// `concordat init <folder>`: a new project with a starter concordance.json and empty input folders.
import type { Command } from 'commander';
import path from 'node:path';

export function register(program: Command): void {
  program
    .command('init')
    .description('start a project: a starter concordance.json and empty catalogues/, evidence/, decisions/ folders')
    .argument('<folder>', 'the project folder (created if missing)')
    .option('--title <text>', 'title of the concordance')
    .option('--base <iri>', 'base IRI for the links, clusters and dataset the project mints')
    .addHelpText('after', '\nExample:\n  concordat init my-concordance\n  concordat add-partner my-concordance/concordance.json --key harbour --catalogue exports/harbour.tsv\n\nExit codes: 0 created, 2 a project file already exists there.')
    .action(async (folder: string, opts: { title?: string; base?: string }) => {
      const { initProject } = await import('../setup/starter.js');
      const made = initProject(folder, opts);
      process.stdout.write(`created in ${folder}: ${made.join(', ')}\nnext: concordat add-partner ${path.join(folder, 'concordance.json')} --key <key> --catalogue <export>\n`);
    });
}
