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
    .option('--json', 'print what was created as JSON on stdout')
    .addHelpText(
      'after',
      '\nExample:\n  concordat init my-concordance\n  concordat add-partner my-concordance/concordance.json --key harbour --catalogue exports/harbour.tsv\n\nExit codes: 0 created, 2 a project file already exists there.',
    )
    .action(async (folder: string, opts: { title?: string; base?: string; json?: boolean }) => {
      const { initProject } = await import('../setup/starter.js');
      const made = initProject(folder, { title: opts.title, base: opts.base });
      const projectFile = path.join(folder, 'concordance.json');
      const next = `concordat add-partner ${projectFile} --key <key> --catalogue <export>`;
      process.stdout.write(
        opts.json
          ? JSON.stringify({ folder, projectFile, created: made, next }, null, 2) + '\n'
          : `created in ${folder}: ${made.join(', ')}\nnext: ${next}\n`,
      );
    });
}
