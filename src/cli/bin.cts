#!/usr/bin/env node
/**
 * Executable of the `dispole` command (package.json "bin").
 *
 * Runs the bundled CLI (`dispole.cjs` beside this file: `main.ts` and its whole import graph in one file, made by
 * `npm run build`) with its V8 code cache, and falls back to the module tree (`main.js`) when no bundle was built
 * (a plain `tsc` build). Why: Node 20 loads ES modules one by one (resolve, read, compile: about a millisecond each
 * on the project machine) and a command imports 50–100 of ours, so the module tree alone roughly doubles the
 * start-up of a small command; this file is CommonJS because an ES-module entry point costs Node's ES loader
 * another ~10 % of `node -e 0` (tests/bench/RESULTS.md, "Speed").
 */
import { join } from 'node:path';
import { runBundle } from './bundle-loader.cjs';

if (!runBundle(join(__dirname, 'dispole.cjs'))) void import('./main.js');
