/**
 * The heap sizing the engine's runs are tuned for (src/cli/heap.ts) reaches every way the
 * command starts: its first line, npm start, and the sweep benchmark that the README quotes.
 */
import { readFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { HEAP_FLAGS } from '../../src/cli/heap.ts';

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '../..');

describe('heap flags', () => {
  it('the furrow command, npm start and npm run bench:sweep all run node with them', () => {
    const first = readFileSync(resolve(ROOT, 'src/cli/bin.mjs'), 'utf8').split('\n')[0]!;
    const scripts = (JSON.parse(readFileSync(resolve(ROOT, 'package.json'), 'utf8')) as { scripts: Record<string, string> }).scripts;
    expect(HEAP_FLAGS.length).toBeGreaterThan(0);
    for (const f of HEAP_FLAGS) {
      expect(first).toBe(`#!/usr/bin/env -S node ${HEAP_FLAGS.join(' ')}`);
      expect(scripts.start).toContain(`node ${f} `);
      expect(scripts['bench:sweep']).toContain(`node ${f} `);
    }
  });
});
