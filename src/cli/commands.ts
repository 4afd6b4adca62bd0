// The table of subcommands: one `register` function per file in src/cli/. Adding a command is one row.
import type { Command } from 'commander';
import { register as check } from './check.js';
import { register as validate } from './validate.js';
import { register as load } from './load.js';
import { register as query } from './query.js';
import { register as build } from './build.js';
import { register as sweep } from './sweep.js';
import { register as diff } from './diff.js';
import { register as cite } from './cite.js';
import { register as init } from './init.js';
import { register as addPartner } from './add-partner.js';
import { register as site } from './site.js';
import { register as serve } from './serve.js';

export type Register = (program: Command) => void;

export const commands: Register[] = [
  check,
  build,
  validate,
  load,
  query,
  sweep,
  diff,
  cite,
  init,
  addPartner,
  site,
  serve,
];
