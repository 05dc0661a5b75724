// `npm run web`: starts Pliant in web mode for a browser on this machine and prints the address
// to open. Run through tsx. Opens a browser only when the BROWSER environment variable names one
// (a common convention, no source); otherwise it just prints.
//
//   tsx electron/web-cli.ts [--port N] [--renderer DIR] [--root DIR]
//
// The page can reach only folders inside the root folder (--root; by default the folder the
// command was started in): it confirms folder picks itself, so the root is what stands between
// a compromised page and the rest of the disk.
import { spawn } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { realpath, stat } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

import { createDefaultServices } from './default-services.ts';
import { createRequestHandlers } from './request-handlers.ts';
import { SAFETY_NOTICE } from './safety-notice.ts';
import { startWebServer } from './web-server.ts';

const repoRoot = fileURLToPath(new URL('..', import.meta.url));

const USAGE = `Usage: npm run web [-- --port N] [-- --renderer DIR] [-- --root DIR]

Serves Pliant to a browser on this machine (127.0.0.1 only) and prints the address to open.
  --port N        listen on port N (default: a free port the system picks)
  --renderer DIR  the built renderer folder (default: dist/renderer)
  --root DIR      the page may open and write folders inside DIR only
                  (default: the folder the command was started in)
Set BROWSER to a browser command to have it opened for you.`;

interface CliOptions {
  port: number;
  rendererDir: string;
  rootDir: string;
}

/** npm runs scripts in the package folder and keeps the folder it was started in as INIT_CWD. */
function startedIn(): string {
  return process.env.INIT_CWD ?? process.cwd();
}

function parseArguments(argv: readonly string[]): CliOptions | string {
  const options: CliOptions = { port: 0, rendererDir: join(repoRoot, 'dist', 'renderer'), rootDir: startedIn() };
  for (let i = 0; i < argv.length; i += 1) {
    const flag = argv[i];
    const value = argv[i + 1];
    if (flag === '--help' || flag === '-h') return USAGE;
    if (flag === '--port') {
      const port = Number(value);
      if (value === undefined || !Number.isInteger(port) || port < 0 || port > 65535) {
        return `--port needs a whole number from 0 to 65535, got ${value === undefined ? 'nothing' : JSON.stringify(value)}.\n\n${USAGE}`;
      }
      options.port = port;
      i += 1;
    } else if (flag === '--renderer') {
      if (value === undefined) return `--renderer needs a folder.\n\n${USAGE}`;
      options.rendererDir = resolve(value);
      i += 1;
    } else if (flag === '--root') {
      if (value === undefined) return `--root needs a folder.\n\n${USAGE}`;
      options.rootDir = resolve(startedIn(), value);
      i += 1;
    } else {
      return `Unknown option ${JSON.stringify(flag)}.\n\n${USAGE}`;
    }
  }
  return options;
}

async function main(): Promise<number> {
  const parsed = parseArguments(process.argv.slice(2));
  if (typeof parsed === 'string') {
    const isHelp = parsed === USAGE;
    (isHelp ? process.stdout : process.stderr).write(`${parsed}\n`);
    return isHelp ? 0 : 2;
  }
  if (!existsSync(join(parsed.rendererDir, 'index.html'))) {
    process.stderr.write(`No built renderer in ${parsed.rendererDir} (index.html is missing). Run "npm run build:renderer" first, or pass --renderer.\n`);
    return 1;
  }
  const rootInfo = await stat(parsed.rootDir).catch(() => null);
  if (!rootInfo?.isDirectory()) {
    process.stderr.write(`--root ${JSON.stringify(parsed.rootDir)} is not a folder${rootInfo ? '' : ' (it does not exist)'}. Give a folder that exists.\n`);
    return 2;
  }
  const rootDir = await realpath(parsed.rootDir);
  const version = (JSON.parse(readFileSync(join(repoRoot, 'package.json'), 'utf8')) as { version: string }).version;
  const services = await createDefaultServices({
    mode: 'web',
    version,
    bundledScenariosDir: join(repoRoot, 'scenarios'),
    folderChooser: { mode: 'in-page', rootDir },
    reportInternalError: (name, error) => console.error(`[pliant] request ${name} failed:`, error),
  });
  let server;
  try {
    server = await startWebServer({
      handlers: createRequestHandlers(services),
      rendererDir: parsed.rendererDir,
      port: parsed.port,
      reportError: (error) => console.error('[pliant] web server error:', error),
    });
  } catch (error) {
    const code = (error as { code?: string }).code;
    process.stderr.write(code === 'EADDRINUSE'
      ? `Port ${parsed.port} is already in use. Pick another with --port, or leave it out to get a free one.\n`
      : `The web server could not start: ${(error as Error).message}\n`);
    return 1;
  }
  process.stdout.write(
    `Pliant web mode is running. Open this address in a browser on this machine:\n\n  ${server.url}\n\n` +
      `The page may open and write folders inside ${rootDir} only (change with --root).\n` +
      `The address carries this session's key; anyone with it can use Pliant as you. Stop with Ctrl+C.\n${SAFETY_NOTICE}\n`,
  );

  const browser = process.env.BROWSER;
  if (browser) {
    const child = spawn(browser, [server.url], { detached: true, stdio: 'ignore' });
    child.on('error', (error) => process.stderr.write(`Could not open the browser "${browser}": ${error.message}\n`));
    child.unref();
  }

  const running = server;
  await new Promise<void>((resolveStop) => {
    let stopping = false;
    const stop = (): void => {
      // A second Ctrl+C while closing stops at once.
      if (stopping) process.exit(130);
      stopping = true;
      // Connections close with the server; a job's worker threads would keep this process alive,
      // so they end with it (a cancelled export resumes from its folder).
      const deadline = setTimeout(resolveStop, STOP_GRACE_MS);
      deadline.unref();
      void running.close().then(resolveStop, resolveStop);
    };
    process.on('SIGINT', stop);
    process.on('SIGTERM', stop);
    process.on('SIGHUP', stop);
  });
  return 0;
}

/** How long closing the server may take before the process ends anyway, ms. */
const STOP_GRACE_MS = 3000;

// Exit explicitly: whatever still runs (job workers, the tsx loader's esbuild service) stops
// with this process rather than keeping it alive after the server has closed.
process.exit(await main());
