// `concordat cite <target> (--release <folder> | --store <folder>) [--format …]`: a quotable citation of a claim.
import { Command, Option } from 'commander';
import type { CiteFormat } from '../cite/index.js';
import { UserError } from '../errors.js';

/**
 * The --format choices; a test checks they equal the keys of CITE_FORMATS (kept literal so --help loads nothing heavy).
 */
export const CITE_FORMAT_NAMES = ['text', 'markdown', 'jsonld', 'csl-json'] as const;

export function register(program: Command): void {
  program
    .command('cite')
    .description('cite what a release says about a work, a pair or a cluster: claims, evidence, run, curator, release')
    .argument(
      '<target>',
      'partnerKey:workId or a work IRI (all claims about that record), a link IRI (one pair, as listed by diff and report.md), or a cluster IRI ({base}work/<id from clusters.csv>)',
    )
    .option('--release <folder>', 'a release folder')
    .option('--store <folder>', 'an embedded store folder (as written by concordat load --store)')
    .addOption(new Option('--format <format>', 'output format').choices([...CITE_FORMAT_NAMES]).default('text'))
    .option(
      '--brief',
      "text and Markdown: no line per image match (each claim's IRI leads to them), runs and release once for all claims",
    )
    .option(
      '--json',
      'the citation as data on stdout: target, release, and per claim its works, status, kind, score, image matches, runs and curator review',
    )
    .addHelpText(
      'after',
      '\nExamples:\n  concordat cite "vellmar:VF 1101" --release releases/2027.1\n  concordat cite https://concordance.example.org/link/043c4c5af186df74 --store store --format csl-json\n\nExit codes: 0 cited, 1 the release holds no claim about the target (nearest matches listed), 2 bad usage or input.',
    )
    .action(
      async (
        target: string,
        opts: { release?: string; store?: string; format: CiteFormat; json?: boolean; brief?: boolean },
        cmd: Command,
      ) => {
        if (opts.json && cmd.getOptionValueSource('format') === 'cli')
          throw new UserError({
            file: 'command line',
            line: 0,
            field: '--json',
            message: `cannot be combined with --format ${opts.format}`,
            hint: 'give one of them',
          });
        const { cite, CITE_FORMATS, citationData } = await import('../cite/index.js'); // loaded on use: keeps --help fast
        const c = await cite(target, { release: opts.release, store: opts.store });
        if (opts.brief) c.brief = true;
        process.stdout.write(
          opts.json ? JSON.stringify(citationData(c), null, 2) + '\n' : await CITE_FORMATS[opts.format](c),
        );
      },
    );
}
