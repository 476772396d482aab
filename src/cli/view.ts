/**
 * `furrow view [design.json] [--port N]`: the browser view, served on 127.0.0.1.
 *
 * The page is the static build of src/web (vite, config src/web/vite.config.ts, output
 * src/web/dist). It is built here on demand when it is missing or older than its sources, so the
 * command works right after `npm ci` on a clean clone. Serving is required, not a convenience:
 * the page computes in ES module workers, which browsers refuse to start from a file:// page.
 *
 * With a design file, the server also answers /furrow-view/design.json with the file's text and
 * the material tables it names (read relative to it, as the CLI reads them), and the page opens
 * on that design (without one: 204 No Content, and the page opens the blazed example).
 */
import { createReadStream, existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { basename, dirname, extname, isAbsolute, join, relative, resolve, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Command } from 'commander';
import { InputError } from '../design/index.ts';
import { CliFailure } from './errors.ts';

/** src/web: the page's sources and its vite config. */
export const WEB_ROOT = fileURLToPath(new URL('../web/', import.meta.url));
/** Where `npm run build` and `furrow view` put the built page. */
export const WEB_DIST = join(WEB_ROOT, 'dist');
const SRC_ROOT = fileURLToPath(new URL('../', import.meta.url));
const LOCKFILE = fileURLToPath(new URL('../../package-lock.json', import.meta.url));

/** Path the page asks for the design given on the command line (absent on a static host). */
export const INITIAL_DESIGN_PATH = '/furrow-view/design.json';

/** What the page receives for the design given on the command line. */
export interface InitialDesign {
  /** the file's name, shown in the page */
  readonly name: string;
  /** the file's text, as read */
  readonly text: string;
  /** material tables the design names: file → text, or the reason it could not be read */
  readonly tables: Record<string, { readonly text: string } | { readonly error: string }>;
}

/** Newest modification time (ms) of the page's inputs: every source under src/ except the build output, and the lockfile. */
function newestSourceMs(): number {
  let newest = existsSync(LOCKFILE) ? statSync(LOCKFILE).mtimeMs : 0;
  const walk = (dir: string): void => {
    for (const e of readdirSync(dir, { withFileTypes: true })) {
      const p = join(dir, e.name);
      if (e.isDirectory()) {
        if (p !== WEB_DIST && e.name !== 'node_modules') walk(p);
      } else if (/\.(ts|mts|js|mjs|json|html|css)$/.test(e.name)) newest = Math.max(newest, statSync(p).mtimeMs);
    }
  };
  walk(SRC_ROOT);
  return newest;
}

/** True when src/web/dist holds a build at least as new as every source it was made from. */
export function webBuildIsCurrent(): boolean {
  const index = join(WEB_DIST, 'index.html');
  return existsSync(index) && statSync(index).mtimeMs >= newestSourceMs();
}

/**
 * Build the page with vite unless a current build is there.
 * @returns the folder to serve and whether it was built now
 * @throws {CliFailure} when vite is not installed or the build fails
 */
export async function ensureWebBuild(log: (s: string) => void = () => {}): Promise<{ dir: string; built: boolean }> {
  if (webBuildIsCurrent()) return { dir: WEB_DIST, built: false };
  let vite: typeof import('vite');
  try {
    vite = await import('vite');
  } catch {
    throw new CliFailure('the browser view is not built and vite is not installed: run `npm ci`, then `npm run build`');
  }
  log('building the browser view (vite) …');
  try {
    await vite.build({ configFile: join(WEB_ROOT, 'vite.config.ts'), logLevel: 'warn' });
  } catch (e) {
    throw new CliFailure(`building the browser view failed: ${e instanceof Error ? e.message : String(e)}`, 1);
  }
  if (!existsSync(join(WEB_DIST, 'index.html'))) throw new CliFailure(`building the browser view left no ${join(WEB_DIST, 'index.html')}`, 1);
  return { dir: WEB_DIST, built: true };
}

/**
 * Read a design file and the material tables it names, for the page.
 * @throws {CliFailure} when the design file cannot be read (its content is checked in the page,
 *   with the same messages as the CLI)
 */
export function readInitialDesign(path: string): InitialDesign {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (e) {
    throw new CliFailure(`cannot read design file ${path}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
  const tables: Record<string, { text: string } | { error: string }> = {};
  let raw: unknown = null;
  try {
    raw = JSON.parse(text);
  } catch {
    // the page reports the JSON error itself
  }
  const list = (raw as { materialTables?: unknown } | null)?.materialTables;
  if (Array.isArray(list)) {
    const dir = dirname(resolve(path));
    for (const t of list) {
      const file = (t as { file?: unknown } | null)?.file;
      if (typeof file !== 'string' || file in tables) continue;
      try {
        tables[file] = { text: readFileSync(resolve(dir, file), 'utf8') };
      } catch (e) {
        tables[file] = { error: (e as NodeJS.ErrnoException).code ?? (e as Error).message };
      }
    }
  }
  return { name: basename(path), text, tables };
}

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.ico': 'image/x-icon',
  '.wasm': 'application/wasm',
  '.map': 'application/json; charset=utf-8',
  '.txt': 'text/plain; charset=utf-8',
};

export interface ViewServer {
  /** http://127.0.0.1:PORT/ */
  readonly url: string;
  readonly port: number;
  close(): Promise<void>;
}

export interface ViewServerOptions {
  /** folder of the built page */
  readonly dir: string;
  /** 0 (default): a free port chosen by the system */
  readonly port?: number;
  readonly design?: InitialDesign | null;
}

/**
 * Serve a built page folder on 127.0.0.1 (GET and HEAD only; nothing outside the folder).
 * @throws {CliFailure} when the port is taken or cannot be opened
 */
export async function startViewServer(o: ViewServerOptions): Promise<ViewServer> {
  const root = resolve(o.dir);
  const designBody = o.design ? JSON.stringify(o.design) : null;
  const server: Server = createServer((req, res) => {
    const send = (status: number, type: string, body: string): void => {
      res.writeHead(status, { 'Content-Type': type, 'Cache-Control': 'no-cache', 'X-Content-Type-Options': 'nosniff' });
      res.end(req.method === 'HEAD' ? undefined : body);
    };
    if (req.method !== 'GET' && req.method !== 'HEAD') {
      res.setHeader('Allow', 'GET, HEAD');
      return send(405, 'text/plain; charset=utf-8', 'method not allowed\n');
    }
    let path: string;
    try {
      path = decodeURIComponent(new URL(req.url ?? '/', 'http://127.0.0.1').pathname);
    } catch {
      return send(400, 'text/plain; charset=utf-8', 'bad request\n');
    }
    if (path === INITIAL_DESIGN_PATH) {
      // 204: no design was given, and nothing for the browser to log as a failed load
      if (designBody === null) {
        res.writeHead(204, { 'Cache-Control': 'no-cache' });
        return res.end();
      }
      return send(200, TYPES['.json']!, designBody);
    }
    const file = resolve(root, `.${path.endsWith('/') ? `${path}index.html` : path}`);
    const rel = relative(root, file);
    if (rel === '..' || rel.startsWith(`..${sep}`) || isAbsolute(rel) || path.includes('\0')) return send(403, 'text/plain; charset=utf-8', 'forbidden\n');
    let size: number;
    try {
      const st = statSync(file);
      if (!st.isFile()) return send(404, 'text/plain; charset=utf-8', 'not found\n');
      size = st.size;
    } catch {
      return send(404, 'text/plain; charset=utf-8', 'not found\n');
    }
    res.writeHead(200, {
      'Content-Type': TYPES[extname(file).toLowerCase()] ?? 'application/octet-stream',
      'Content-Length': size,
      'Cache-Control': 'no-cache',
      'X-Content-Type-Options': 'nosniff',
    });
    if (req.method === 'HEAD') return res.end();
    createReadStream(file).pipe(res);
  });
  await new Promise<void>((ok, fail) => {
    server.once('error', (e: NodeJS.ErrnoException) =>
      fail(new CliFailure(e.code === 'EADDRINUSE' ? `--port: port ${o.port} is in use; choose another or leave --port out` : `cannot serve on 127.0.0.1: ${e.message}`)),
    );
    server.listen(o.port ?? 0, '127.0.0.1', () => ok());
  });
  const port = (server.address() as AddressInfo).port;
  return {
    url: `http://127.0.0.1:${port}/`,
    port,
    close: () =>
      new Promise<void>((ok) => {
        server.closeAllConnections();
        server.close(() => ok());
      }),
  };
}

function parsePort(text: string | undefined): number {
  if (text === undefined) return 0;
  const n = Number(text);
  if (!(Number.isInteger(n) && n >= 1 && n <= 65535)) throw new InputError('--port', `expected a port number 1…65535, found "${text}"`);
  return n;
}

/**
 * `furrow view`: build the page if needed, serve it, print its address. The command returns
 * once the server listens; the open server keeps the process running until it is stopped.
 */
export function registerViewCommand(program: Command, out: (s: string) => void): void {
  program
    .command('view')
    .description('open the browser view: edit a design, see its cross-section, sweep and plot TE/TM efficiencies (served on 127.0.0.1)')
    .argument('[design]', 'design file (JSON) to open; default: the blazed aluminium example')
    .option('--port <N>', 'port on 127.0.0.1 (default: a free one)')
    .action(async (design: string | undefined, opts: { port?: string }) => {
      const port = parsePort(opts.port);
      const initial = design !== undefined ? readInitialDesign(design) : null;
      const { dir } = await ensureWebBuild(out);
      const server = await startViewServer({ dir, port, design: initial });
      out(`Furrow view: ${server.url}${initial ? `  (design ${initial.name})` : ''}`);
      out('open it in a browser; Ctrl-C stops the server');
    });
}
