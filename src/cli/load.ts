// `concordat load <release>`: a release folder → graphs in a store folder or a remote SPARQL store.
import { Option, type Command } from 'commander';
import { deprecated } from './options.js';

interface LoadOpts {
  store?: string;
  endpoint?: string;
  update?: string;
  queryEndpoint?: string;
  /** Deprecated spelling of --query-endpoint. */
  query?: string;
  graph?: string;
  partner?: string;
  json?: boolean;
}

export function register(program: Command): void {
  program
    .command('load')
    .description(
      'load a release into a store: each named graph of concordance.nq under its own IRI, a partner slice, or everything into one graph',
    )
    .argument('<release>', 'a release folder, e.g. releases/2026.1')
    .option(
      '--store <folder>',
      'embedded store folder (created if missing; one N-Quads file per graph + manifest.json)',
    )
    .option('--endpoint <url>', 'remote SPARQL 1.1 Graph Store Protocol URL')
    .option('--update <url>', 'remote SPARQL 1.1 Update URL')
    .option('--query-endpoint <url>', 'remote SPARQL 1.1 Query URL (as in concordat query)')
    .addOption(new Option('--query <url>', 'deprecated: --query-endpoint').hideHelp())
    .option('--graph <iri>', 'load all statements (graph names dropped) into this one graph')
    .option('--partner <key>', 'load partners/<key>.nq into --graph or {base}graph/partner/<key>')
    .option('--json', 'print what was loaded as JSON on stdout')
    .addHelpText(
      'after',
      '\nExamples:\n  concordat load releases/2026.1 --store store/\n' +
        '  concordat load releases/2026.1 --partner harbour --endpoint http://127.0.0.1:8890/sparql-graph-crud-auth \\\n' +
        '      --update http://127.0.0.1:8890/sparql-auth --query-endpoint http://127.0.0.1:8890/sparql\n\n' +
        'Credentials for a remote store: CONCORDAT_STORE_USER and CONCORDAT_STORE_PASSWORD, or a netrc entry ($NETRC or ~/.netrc).\n' +
        'A release replaces the previous one all or nothing. Exit codes: 0 loaded, 1 the store refused or failed (the message\n' +
        'says which graphs were replaced, if any), 2 bad input. Basic authentication over plain http is refused except on\n' +
        'this machine (loopback) or with CONCORDAT_STORE_ALLOW_BASIC_OVER_HTTP=1.',
    )
    .action(async (release: string, opts: LoadOpts) => {
      const { checkStoreChoice, openStore } = await import('../store/open.js');
      const { loadRelease, planRelease } = await import('../store/release.js');
      if (opts.query) deprecated('--query', '--query-endpoint');
      const choice = {
        store: opts.store,
        endpoint: opts.endpoint,
        update: opts.update,
        query: opts.queryEndpoint ?? opts.query,
      };
      checkStoreChoice(choice);
      // the release is checked before the store is opened: a refused release leaves no store folder behind
      const plan = await planRelease(release, { graph: opts.graph, partner: opts.partner });
      const store = await openStore(choice);
      try {
        const t0 = performance.now();
        const { loads: done, dropped } = await loadRelease(store, plan, { graph: opts.graph });
        const graphs = done.map((d) => ({ graph: d.graph, triples: d.triples }));
        for (const d of dropped)
          process.stderr.write(
            `concordat: removed <${d.graph}> from the store: it held ${d.release ? `release ${d.release}` : 'no release version'}, not the one loaded\n`,
          );
        process.stdout.write(
          opts.json
            ? JSON.stringify({ release, graphs, dropped }, null, 2) + '\n'
            : graphs.map((g) => `${g.graph}\t${g.triples}\n`).join(''),
        );
        if (process.stderr.isTTY)
          process.stderr.write(`loaded ${done.length} graph(s) in ${((performance.now() - t0) / 1000).toFixed(1)} s\n`);
      } finally {
        await store.close();
      }
    });
}
