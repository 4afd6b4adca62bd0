// `concordat serve <site> [--port] [--host]`: a local preview server for a site folder, answering as the generated
// rules do.
import type { Command } from 'commander';
import { numberIn } from './options.js';

export function register(program: Command): void {
  program
    .command('serve')
    .description(
      'serve a site folder written by concordat site: content negotiation, 303 See Other from minted IRIs, security and caching headers',
    )
    .argument('<site>', 'a site folder')
    .option('--port <n>', 'TCP port (0: any free port)', numberIn(0, 65535, { integer: true, example: '8080' }), 8080)
    .option('--host <address>', 'address to listen on', '127.0.0.1')
    .addHelpText(
      'after',
      '\nExample:\n  concordat serve site/2027.1 --port 8080\n  curl -i -H "Accept: text/turtle" http://127.0.0.1:8080/work/c000001\n\nExit codes: 0 stopped, 2 bad usage or not a site folder.',
    )
    .action(async (site: string, opts: { port: number; host: string }) => {
      const port = opts.port;
      const { serveSite } = await import('../serve/index.js');
      const s = await serveSite(site, { port, host: opts.host });
      process.stdout.write(`serving ${site} at ${s.url} (Ctrl-C stops)\n`);
      const stop = () => {
        void s.close().then(() => process.exit(0));
      };
      process.once('SIGINT', stop);
      process.once('SIGTERM', stop);
    });
}
