// Substituted by esbuild for `node:child_process` in the CommonJS bundle of the CLI (package.json, "bundle").
// commander requires child_process when it loads, only to run external-executable subcommands, which dispole does
// not have; loading it (and the network modules it pulls in) costs every run ~5 % of `node -e 0`. This stand-in
// loads the real module on first use of any of its members (the name is a variable so that the bundler leaves
// this `require` to Node instead of resolving it to this file again).
const realName = 'node:child_process';
let real;
module.exports = new Proxy({}, { get: (_, member) => (real ??= require(realName))[member] });
