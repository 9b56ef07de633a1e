/**
 * Runs the bundled CLI, compiled with a V8 code cache when one was recorded for it.
 *
 * The bundle (`dispole.cjs`, made by esbuild in `npm run bundle`) is CommonJS whose text is already wrapped as
 * Node wraps a module — `(function (exports, require, module, __filename, __dirname) { … })` — so it is compiled
 * as it is read, without a second copy of a 0.6 MB string. The code cache (`<bundle>.v8cache`, written by
 * `npm run build` after a run of the worked example) holds the bytecode of every function that run compiled, so a
 * later process skips most of the bundle's parse and compile (Node 20 has no built-in compile cache for user code;
 * `vm.Script` with `cachedData` is the documented way). V8 checks the cache against the source, its own version and
 * flags; a cache it rejects is ignored and the bundle is compiled as usual, so a stale or foreign cache can only
 * cost time, never change a result.
 */
import { isAscii } from 'node:buffer';
import { readFileSync, renameSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname } from 'node:path';
import { Script } from 'node:vm';

/** Set to 1 by `npm run build` for the one run that records the code cache. */
const RECORD_CODE_CACHE_VARIABLE = 'DISPOLE_RECORD_CODE_CACHE';

/** The code cache's file beside the bundle. */
function codeCachePath(bundleFile: string): string {
  return `${bundleFile}.v8cache`;
}

/** Reads a file, or undefined when it is not there (or not readable: the caller then falls back). */
function readIfPresent(file: string): Buffer | undefined {
  try {
    return readFileSync(file);
  } catch {
    return undefined;
  }
}

/** Writes the code cache of everything compiled so far, whole or not at all (temporary file, then rename). */
function recordCodeCache(script: Script, cacheFile: string): void {
  const temporary = `${cacheFile}.${process.pid}.tmp`;
  writeFileSync(temporary, script.createCachedData());
  renameSync(temporary, cacheFile);
}

/** The signature of Node's module wrapper, which the bundle's text is. */
type ModuleWrapper = (
  exports: object,
  require: NodeJS.Require,
  module: { exports: object },
  filename: string,
  directory: string,
) => void;

/**
 * Runs the wrapped CommonJS bundle `file` as Node's module loader would (same wrapper arguments, a `require`
 * relative to the bundle), with its code cache if present. Returns false, having run nothing, when there is no
 * bundle.
 */
export function runBundle(file: string): boolean {
  const bytes = readIfPresent(file);
  if (bytes === undefined) return false;
  // ASCII text (esbuild's default output) decodes as Latin-1 into a one-byte string, without UTF-8 decoding
  const source = bytes.toString(isAscii(bytes) ? 'latin1' : 'utf8');
  const cacheFile = codeCachePath(file);
  const script = new Script(source, { filename: file, cachedData: readIfPresent(cacheFile) });
  if (process.env[RECORD_CODE_CACHE_VARIABLE] === '1') process.once('exit', () => recordCodeCache(script, cacheFile));
  const wrapper = script.runInThisContext() as ModuleWrapper;
  const module = { exports: {} };
  wrapper.call(module.exports, module.exports, createRequire(file), module, file, dirname(file));
  return true;
}
