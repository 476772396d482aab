/**
 * `furrow view`'s server without a browser: what it serves from a page folder, what it refuses,
 * the design handed to the page (with the material tables it names), and the command's errors.
 */
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { request } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Command } from 'commander';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CliFailure } from '../../src/cli/main.ts';
import { INITIAL_DESIGN_PATH, readInitialDesign, registerViewCommand, startViewServer, type ViewServer } from '../../src/cli/view.ts';
import { InputError } from '../../src/design/index.ts';

const root = mkdtempSync(join(tmpdir(), 'furrow-view-'));
const site = join(root, 'site');
mkdirSync(join(site, 'assets'), { recursive: true });
writeFileSync(join(site, 'index.html'), '<!doctype html><title>page</title>');
writeFileSync(join(site, 'assets', 'app.js'), 'export {};');
writeFileSync(join(root, 'secret.txt'), 'not for the browser');

/** Raw HTTP, so paths reach the server exactly as written (no client-side normalization). */
function get(url: string, path: string, method = 'GET'): Promise<{ status: number; type: string | undefined; body: string }> {
  const u = new URL(url);
  return new Promise((ok, fail) => {
    const req = request({ host: u.hostname, port: u.port, path, method }, (res) => {
      let body = '';
      res.setEncoding('utf8');
      res.on('data', (c: string) => (body += c));
      res.on('end', () => ok({ status: res.statusCode ?? 0, type: res.headers['content-type'], body }));
    });
    req.on('error', fail);
    req.end();
  });
}

describe('furrow view server', () => {
  let plain: ViewServer;
  let withDesign: ViewServer;

  beforeAll(async () => {
    const designDir = join(root, 'designs');
    mkdirSync(designDir);
    writeFileSync(join(designDir, 'al.csv'), 'wavelength_nm,n,k\n400,0.49,4.86\n700,1.83,8.31\n');
    const designPath = join(designDir, 'mine.json');
    writeFileSync(designPath, JSON.stringify({ substrate: 'my-Al', materialTables: [{ name: 'my-Al', file: 'al.csv' }, { name: 'gone', file: 'missing.csv' }] }));
    plain = await startViewServer({ dir: site });
    withDesign = await startViewServer({ dir: site, design: readInitialDesign(designPath) });
  });

  afterAll(async () => {
    await plain?.close();
    await withDesign?.close();
  });

  it('listens on 127.0.0.1 at a free port and serves the page folder with its types', async () => {
    expect(plain.url).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/$/);
    expect(plain.port).toBeGreaterThan(0);
    const index = await get(plain.url, '/');
    expect(index.status).toBe(200);
    expect(index.type).toBe('text/html; charset=utf-8');
    expect(index.body).toContain('<title>page</title>');
    const js = await get(plain.url, '/assets/app.js?v=1');
    expect(js.status).toBe(200);
    expect(js.type).toBe('text/javascript; charset=utf-8');
    const head = await get(plain.url, '/assets/app.js', 'HEAD');
    expect(head.status).toBe(200);
    expect(head.body).toBe('');
  });

  it('serves nothing outside the page folder and only GET and HEAD', async () => {
    expect((await get(plain.url, '/../secret.txt')).body).not.toContain('not for the browser');
    expect((await get(plain.url, '/..%2fsecret.txt')).status).toBe(403);
    expect((await get(plain.url, '/assets/..%2f..%2fsecret.txt')).status).toBe(403);
    expect((await get(plain.url, '/%00index.html')).status).toBe(403);
    expect((await get(plain.url, '/nothing-here.js')).status).toBe(404);
    expect((await get(plain.url, '/assets')).status).toBe(404);
    expect((await get(plain.url, '/', 'POST')).status).toBe(405);
  });

  it('answers the design request with 204 when no design was given', async () => {
    const r = await get(plain.url, INITIAL_DESIGN_PATH);
    expect(r.status).toBe(204);
    expect(r.body).toBe('');
  });

  it('hands the page the design file and the material tables it names, read beside it', async () => {
    const r = await get(withDesign.url, INITIAL_DESIGN_PATH);
    expect(r.status).toBe(200);
    const j = JSON.parse(r.body) as { name: string; text: string; tables: Record<string, { text?: string; error?: string }> };
    expect(j.name).toBe('mine.json');
    expect(JSON.parse(j.text).substrate).toBe('my-Al');
    expect(j.tables['al.csv']?.text).toMatch(/^wavelength_nm,n,k\n400,0\.49,4\.86/);
    expect(j.tables['missing.csv']).toEqual({ error: 'ENOENT' });
  });

  it('a design file that cannot be read is the CLI failure the other commands give', () => {
    expect(() => readInitialDesign(join(root, 'no-such.json'))).toThrow(new CliFailure(`cannot read design file ${join(root, 'no-such.json')}: ENOENT`));
  });

  it('a port in use and a malformed --port are reported plainly', async () => {
    await expect(startViewServer({ dir: site, port: plain.port })).rejects.toThrow(`--port: port ${plain.port} is in use; choose another or leave --port out`);
    const program = new Command().exitOverride();
    registerViewCommand(program, () => {});
    await expect(program.parseAsync(['node', 'furrow', 'view', '--port', '70000'])).rejects.toThrow(new InputError('--port', 'expected a port number 1…65535, found "70000"'));
  });
});
