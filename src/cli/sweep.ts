// `concordat sweep <project>`: precision, recall and F1 against the gold concordance for a range of proposeAt values.
import type { Command } from 'commander';
import { numberIn, projectArg, score } from './options.js';

export function register(program: Command): void {
  program
    .command('sweep')
    .description('measure precision, recall and F1 against the gold concordance for a range of proposeAt thresholds')
    .argument('<project>', 'the project file, e.g. demo-data/concordance.json, or the folder holding it', projectArg)
    .option('--from <score>', 'lowest proposeAt (0 to 1)', score('0.4'), 0.3)
    .option('--to <score>', 'highest proposeAt (0 to 1)', score('0.9'), 0.95)
    .option(
      '--step <score>',
      'distance between thresholds (above 0, at most 1)',
      numberIn(0, 1, { above: true, example: '0.05' }),
      0.05,
    )
    .option('--json', 'print the rows as JSON on stdout')
    .addHelpText(
      'after',
      '\nExample:\n  concordat sweep demo-data/concordance.json --from 0.4 --to 0.9 --step 0.1\n\nExit codes: 0 measured, 2 bad input or no gold concordance.',
    )
    .action(async (project: string, opts: { from: number; to: number; step: number; json?: boolean }) => {
      const { load } = await import('../load/index.js');
      const { sweep, sweepValues, sweepTable } = await import('../analyse/index.js');
      const values = sweepValues(opts.from, opts.to, opts.step);
      const { model } = await load(project);
      const rows = sweep(model, values);
      process.stdout.write(opts.json ? JSON.stringify(rows, null, 2) + '\n' : sweepTable(rows));
    });
}
