#!/usr/bin/env node
/**
 * The same executable as `bin.cts` under the path earlier builds had (`node dist/cli/bin.js …`): an ES module that
 * hands over to the CommonJS one, so scripts written for that path keep working (a little slower to start).
 */
import { createRequire } from 'node:module';

createRequire(import.meta.url)('./bin.cjs');
