// `concordat query`: SPARQL text, a .rq file or a named query → results as a table, SPARQL JSON, CSV, TSV or N-Triples.
import { Option, type Command } from 'commander';
import type { ResultFormat } from '../store/format.js';
import { UserError } from '../errors.js';

interface QueryOpts {
  store?: string;
  queryEndpoint?: string;
  named?: string;
  param: string[];
  format?: ResultFormat;
  json?: boolean;
}

/** A value that looks like `partner:work` (a scheme with no `//` and none of the usual schemes without one). */
const SHORT_REF = /^(?!(?:urn|mailto|tag|info|doi|data):)[A-Za-z][A-Za-z0-9+.-]*:(?!\/\/)/i;

export function register(program: Command): void {
  program
    .command('query')
    .description('run a SPARQL query (text, a .rq file, or a named query from queries/) against a store')
    .argument('[query]', 'SPARQL text or a .rq file')
    .option('--store <folder>', 'embedded store folder written by concordat load')
    .option('--query-endpoint <url>', 'remote SPARQL 1.1 Query URL')
    .option('--named <name>', 'a query shipped in queries/, e.g. cluster-members')
    .option(
      '--param <key=value>',
      'value for a parameter the query header declares (repeatable)',
      (v: string, all: string[]) => [...all, v],
      [] as string[],
    )
    .addOption(
      new Option(
        '--format <format>',
        'SELECT output: aligned table (default on a terminal), SPARQL JSON, CSV or TSV (default otherwise)',
      ).choices(['table', 'json', 'csv', 'tsv']),
    )
    .option('--json', 'SELECT and ASK results as SPARQL 1.1 Query Results JSON (the same as --format json)')
    .addHelpText(
      'after',
      '\nExamples:\n  concordat query --store store/ --named cluster-members --param cluster=https://concordance.example.org/work/c000001   (the base IRI + work/ + an ID from clusters.csv)\n' +
        "  concordat query --query-endpoint http://127.0.0.1:8890/sparql 'ASK { ?s ?p ?o }'\n\n" +
        'ASK prints true or false (exit 0 either way); CONSTRUCT and DESCRIBE print N-Triples.\n' +
        'Parameters are bound as escaped terms, never pasted as text. Exit codes: 0 ran, 1 the store failed, 2 bad query or usage.',
    )
    .action(async (arg: string | undefined, opts: QueryOpts) => {
      if (opts.json && opts.format && opts.format !== 'json')
        throw new UserError({
          file: 'command line',
          line: 0,
          field: '--json',
          message: `cannot be combined with --format ${opts.format}`,
          hint: 'give one of them',
        });
      const { formatResult } = await import('../store/format.js');
      const { openStore, parseParams, queryText } = await import('../store/open.js');
      const params = parseParams(opts.param);
      const sparql = await queryText(arg, opts.named, params);
      const store = await openStore({ store: opts.store, query: opts.queryEndpoint, existing: true });
      try {
        const result = await store.query(sparql);
        const format = opts.json ? 'json' : (opts.format ?? (process.stdout.isTTY ? 'table' : 'tsv'));
        process.stdout.write(formatResult(result, format));
        if (result.kind === 'bindings' && result.rows.length === 0)
          for (const [k, v] of Object.entries(params))
            if (SHORT_REF.test(v))
              process.stderr.write(
                `concordat: note: no rows; --param ${k}=${v} was read as an IRI of scheme "${v.split(':')[0]}:", and records are named by their full IRI (the IRI column of clusters.csv; cite accepts partner:work)\n`,
              );
      } finally {
        await store.close();
      }
    });
}
