#!/usr/bin/env -S node --initial-old-space-size=128
// The `furrow` command: load the TypeScript CLI through tsx's loader, then run it.
import { register } from 'tsx/esm/api';

register();
// `furrow … | head` closes the pipe early: that is the reader's choice, not an error
process.stdout.on('error', (e) => {
  if (e.code === 'EPIPE') process.exit(0);
  throw e;
});
// heap sizing (see heap.ts): the first line gives it to this thread, this call to the worker threads
const { tuneHeapForWorkers } = await import('./heap.ts');
tuneHeapForWorkers();
const { main } = await import('./main.ts');
process.exitCode = await main(process.argv);
