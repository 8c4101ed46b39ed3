// Preloaded (node/tsx --require) by scripts that use the data layer outside Next: the
// "server-only" marker guards client bundles and has nothing to guard in a script. Next's
// react-server condition would also do, but it swaps React for its server build, which
// next-intl's translator cannot load.
const Module = require("node:module");
const resolve = Module._resolveFilename;
Module._resolveFilename = function (request, ...rest) {
  return request === "server-only" ? __filename : resolve.call(this, request, ...rest);
};
