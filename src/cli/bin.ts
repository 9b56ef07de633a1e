#!/usr/bin/env node
/** Executable entry point of the `dispole` command. */
import { runCli } from './program.js';
import { nodeIO } from './io.js';

runCli(process.argv.slice(2), nodeIO).then(
  (code) => {
    process.exitCode = code;
  },
  (e: unknown) => {
    process.stderr.write(`dispole: internal error: ${(e as Error).stack ?? String(e)}\n`);
    process.exitCode = 70;
  },
);
