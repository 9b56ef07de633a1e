// Injected by esbuild into the CommonJS bundle of the CLI (package.json, "bundle"): `import.meta.url` of the ES
// module sources becomes the bundle's own file URL, so `createRequire(import.meta.url)` still finds node_modules.
export const import_meta_url = require('node:url').pathToFileURL(__filename).href;
