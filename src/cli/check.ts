// `concordat check <project>`: load every input, print a summary; exit 0 clean, 2 bad input.
import type { Command } from 'commander';
import { projectArg } from './options.js';

export function register(program: Command): void {
  program
    .command('check')
    .description('read the project file and every input it names; report problems or print a summary')
    .argument('<project>', 'the project file, e.g. demo-data/concordance.json, or the folder holding it', projectArg)
    .option('--json', 'print the summary as JSON on stdout (every warning)')
    .option('--verbose', 'print every warning (default: more than three of one kind are summarised with a count)')
    .addHelpText(
      'after',
      '\nExample:\n  concordat check demo-data/concordance.json\n\nExit codes: 0 clean (warnings allowed), 2 bad input (each problem as file:line: field: message (hint)).',
    )
    .action(async (project: string, opts: { json?: boolean; verbose?: boolean }) => {
      const { load } = await import('../load/index.js'); // loaded on use: keeps --help fast
      const { summarise, summaryText } = await import('../load/summary.js');
      const { link, duplicateWarnings } = await import('../link/index.js');
      const { model, stats } = await load(project);
      (await import('../rdf/vocab-map.js')).loadVocabMap(model.project.vocabMap, model.project.base); // the vocab map's patterns are input too
      for (const w of duplicateWarnings(model, link(model).duplicates)) model.warnings.push(w); // no spread: 150k+ rows
      const summary = summarise(model, stats);
      process.stdout.write(opts.json ? JSON.stringify(summary, null, 2) + '\n' : summaryText(summary, opts.verbose));
    });
}
