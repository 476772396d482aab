/** The design example printed in the README is a valid design (docs that lie are bugs). */
import { readFileSync } from 'node:fs';
import { expect, it } from 'vitest';
import { designToProblem } from '../../src/design/index.ts';

it('the README design-file example validates and builds a problem', () => {
  const readme = readFileSync(new URL('../../README.md', import.meta.url), 'utf8');
  const section = readme.slice(readme.indexOf('### Design file'));
  const block = /```json\n([\s\S]*?)```/.exec(section);
  expect(block, 'README has a json example under "### Design file"').not.toBeNull();
  const p = designToProblem(JSON.parse(block![1]!));
  expect(p.structure.layers.length).toBeGreaterThan(10);
  expect(p.warnings).toEqual([]);
});
