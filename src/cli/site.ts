// `concordat site <release> --out <folder> [--json]`: a release as a static site in which every minted IRI resolves.
import type { Command } from 'commander';
import { numberIn } from './options.js';

export function register(program: Command): void {
  program
    .command('site')
    .description(
      'write a release as a static web site: every IRI the release mints answers HTML, Turtle and JSON-LD (303 by Accept), with pages to read and cite, search, the vocabulary and nginx/Apache rules',
    )
    .argument('<release>', 'a release folder written by concordat build')
    .requiredOption('--out <folder>', 'the site folder to create (never overwritten)')
    .option(
      '--previous <site>',
      'the site of the previous release: its documents and claims this release no longer has are kept, so IRIs cited from earlier releases still resolve',
    )
    .option(
      '--threads <n>',
      'worker threads writing the site (default: one per core, at most 4); the files are the same for any number',
      numberIn(1, 64, { integer: true, example: '--threads 2' }),
    )
    .option('--json', 'print what was written as JSON')
    .addHelpText(
      'after',
      '\nExample:\n  concordat site releases/2027.1 --out site/2027.1 --previous site/2026.1\n  concordat serve site/2027.1\n\nExit codes: 0 written, 2 bad usage or not a release folder.',
    )
    .action(async (release: string, opts: { out: string; json?: boolean; previous?: string; threads?: number }) => {
      const { writeSite } = await import('../site/index.js');
      const s = await writeSite(release, opts.out, {
        previous: opts.previous,
        parts: opts.threads,
      });
      if (opts.json) process.stdout.write(JSON.stringify(s, null, 2) + '\n');
      else
        process.stdout.write(
          `site of release ${s.version} written to ${s.out}: ${s.documents} documents, ${s.files} files, ${(s.bytes / 2 ** 20).toFixed(1)} MiB (and ${(s.downloadBytes / 2 ** 20).toFixed(1)} MiB of downloads, hard-linked from the release)\npreview: concordat serve ${opts.out}\nweb servers: nginx-http.conf + nginx-server.conf, apache.htaccess in the folder\n`,
        );
    });
}
