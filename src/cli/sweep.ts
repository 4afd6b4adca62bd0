// `concordat sweep <project>`: precision, recall and F1 against the gold concordance for a range of proposeAt values.
import type { Command } from 'commander';

export function register(program: Command): void {
  program
    .command('sweep')
    .description('measure precision, recall and F1 against the gold concordance for a range of proposeAt thresholds')
    .argument('<project>', 'the project file, e.g. demo-data/concordance.json')
    .option('--from <score>', 'lowest proposeAt', '0.3')
    .option('--to <score>', 'highest proposeAt', '0.95')
    .option('--step <score>', 'distance between thresholds', '0.05')
    .option('--json', 'print the rows as JSON on stdout')
    .addHelpText('after', '\nExample:\n  concordat sweep demo-data/concordance.json --from 0.4 --to 0.9 --step 0.1\n\nExit codes: 0 measured, 2 bad input or no gold concordance.')
    .action(async (project: string, opts: { from: string; to: string; step: string; json?: boolean }) => {
      const { load } = await import('../load/index.js');
      const { sweep, sweepValues, sweepTable } = await import('../analyse/index.js');
      const values = sweepValues(Number(opts.from), Number(opts.to), Number(opts.step));
      const { model } = await load(project);
      const rows = sweep(model, values);
      process.stdout.write(opts.json ? JSON.stringify(rows, null, 2) + '\n' : sweepTable(rows));
    });
}
