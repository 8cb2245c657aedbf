// Imported first by extension.ts, so this line runs before any other module body of the bundle: the
// start of the extension's own load, as close to the host's require of out/extension.js as code can see.
export const moduleLoadStart = performance.now();
