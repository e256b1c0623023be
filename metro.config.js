// Metro (the web bundler): Expo's defaults plus substitutions that keep library code the browser never runs out of
// the bundle, since Metro does not drop unused exports (the first screen has a size budget:
// tests/support/web-budget.ts). The server and the tests use the libraries whole.
const { getDefaultConfig } = require('expo/metro-config');
const path = require('node:path');

const config = getDefaultConfig(__dirname);
const stand = (file) => path.join(__dirname, 'scripts', 'web', file);
const substitutes = new Map([
  [path.join('zod', 'v4', 'locales', 'index.js'), stand('zod-locales-en.js')],
  [path.join('zod', 'v4', 'core', 'compile.js'), stand('zod-unused.js')],
  [path.join('zod', 'v4', 'core', 'json-schema-processors.js'), stand('zod-unused.js')],
  [path.join('zod', 'v4', 'core', 'json-schema-generator.js'), stand('zod-unused.js')],
  [path.join('zod', 'v4', 'core', 'to-json-schema.js'), stand('zod-unused.js')],
  [path.join('zod', 'v4', 'classic', 'from-json-schema.js'), stand('zod-unused.js')],
]);

const upstream = config.resolver.resolveRequest;
config.resolver.resolveRequest = (context, moduleName, platform) => {
  const resolved = upstream ? upstream(context, moduleName, platform) : context.resolveRequest(context, moduleName, platform);
  if (resolved.type === 'sourceFile' && !context.originModulePath.startsWith(path.join(__dirname, 'scripts', 'web'))) {
    for (const [suffix, file] of substitutes) if (resolved.filePath.endsWith(suffix)) return { type: 'sourceFile', filePath: file };
  }
  return resolved;
};

module.exports = config;
