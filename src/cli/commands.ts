// The table of subcommands: one `register` function per file in src/cli/. Adding a command is one row.
import type { Command } from 'commander';

export type Register = (program: Command) => void;

export const commands: Register[] = [];
