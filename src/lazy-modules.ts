/**
 * The one place that decides which third-party packages (and heavy Node built-ins) are loaded on first use instead of
 * at start-up.
 *
 * Loading a package costs the whole process its parse and set-up time even when the command never calls it
 * (measured on the project machine: yaml ~0.1 s, ml-matrix ~0.1 s, mathjs ~1 s), so the modules that need one of
 * these call its getter here at the point of use. The getters are synchronous (`createRequire`, the packages'
 * CommonJS entry points), so the engines stay synchronous pure functions; each package is loaded once and cached by
 * Node's module cache. Types come from the packages' own declarations (`typeof import(...)` is erased at build time).
 *
 * Our own modules are made lazy per command in `src/cli/commands/index.ts` (a command's module, and so its
 * engines, is imported only when that command runs).
 */
import { createRequire } from 'node:module';

const requireModule = createRequire(import.meta.url);

/** `yaml` (species files). */
export function yamlModule(): typeof import('yaml') {
  return requireModule('yaml') as typeof import('yaml');
}

/** `ml-matrix` (small dense decompositions: Cholesky, SVD, QR in the atom and fit engines). */
export function mlMatrixModule(): typeof import('ml-matrix') {
  return requireModule('ml-matrix') as typeof import('ml-matrix');
}

/**
 * mathjs, for its expression parser only. Its single-file bundle (same version, same parser) loads in about a tenth
 * of the time of the package's CommonJS tree, which `require`s several hundred files (project machine: ~0.13 s
 * against ~1 s).
 */
export function mathjsModule(): typeof import('mathjs') {
  return requireModule('mathjs/lib/browser/math.js') as typeof import('mathjs');
}

/**
 * `node:worker_threads`: only the thread team of large dense eigenproblems starts workers, but loading the module
 * (and the stream machinery it pulls in) costs every process that merely imports the eigensolver a few ms.
 */
export function workerThreadsModule(): typeof import('node:worker_threads') {
  return requireModule('node:worker_threads') as typeof import('node:worker_threads');
}

/** `node:crypto`, for the random part of a temporary file name (only commands that write a file need it). */
export function cryptoModule(): typeof import('node:crypto') {
  return requireModule('node:crypto') as typeof import('node:crypto');
}
