// Worker-thread entry of the sweep pool. A worker thread does not inherit the TypeScript loader
// of the thread that started it, so this plain-JS file registers tsx's require hook (in-thread,
// so threads starting together do not queue behind one shared loader thread) and then loads
// the TypeScript handler.
import { createRequire } from 'node:module';
import { register } from 'tsx/cjs/api';

register();
const { default: evaluateBatch } = createRequire(import.meta.url)('./sweep-handler.ts');

export default evaluateBatch;
