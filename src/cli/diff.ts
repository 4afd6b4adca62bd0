// `concordat diff <old release> <new release> [--json]`: what changed between two release folders.
import type { Command } from 'commander';

export function register(program: Command): void {
  program
    .command('diff')
    .description(
      'compare two release folders: claims added, removed, with a new status or kind; clusters merged, split, new, retired; per partner',
    )
    .argument('<old>', 'the earlier release folder')
    .argument('<new>', 'the later release folder')
    .option('--json', 'print the changes as JSON')
    .addHelpText(
      'after',
      '\nExample:\n  concordat diff releases/2026.1 releases/2027.1\n\nExit codes: 0 compared (with or without changes), 2 a folder is not a release.',
    )
    .action(async (oldDir: string, newDir: string, opts: { json?: boolean }) => {
      const { diffReleases } = await import('../history/diff.js');
      const { changesMarkdown } = await import('../history/markdown.js');
      const changes = await diffReleases(oldDir, newDir);
      process.stdout.write(opts.json ? JSON.stringify(changes, null, 2) + '\n' : changesMarkdown(changes));
    });
}
