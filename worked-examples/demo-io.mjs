// Loads the built CLI runner and the process IO from dist/ (built by `npm run demo`).
export { runCli } from '../dist/cli/program.js';
export { nodeIO } from '../dist/cli/io.js';
