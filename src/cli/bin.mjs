#!/usr/bin/env node
// The `furrow` command: load the TypeScript CLI through tsx's loader, then run it.
import { register } from 'tsx/esm/api';

register();
const { main } = await import('./main.ts');
process.exitCode = await main(process.argv);
