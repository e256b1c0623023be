// The web bundle's stand-in for zod's JSON Schema conversion and its compiler (metro.config.js): the app only
// parses and validates, so these parts (about 70 KB minified) never run in the browser. Each throws with a reason
// if one ever is reached, instead of failing somewhere obscure. The server uses the whole of zod.
const absent = (what) => () => {
  throw new Error(`zod's ${what} is left out of the Loftline web bundle (metro.config.js); use it on the server.`);
};
export const INVALID = Symbol.for('zod.compile.invalid');
export class ZodCompileAsyncError extends Error {}
export class ZodCompileUnsupportedError extends Error {}
export const compile = absent('compile');
export const withParser = absent('withParser');
export const compileFn = absent('compileFn');
export const toJSONSchema = absent('toJSONSchema');
export const fromJSONSchema = absent('fromJSONSchema');
export const createToJSONSchemaMethod = () => absent('toJSONSchema');
export const createStandardJSONSchemaMethod = () => absent('JSON Schema conversion');
export const aggregateChecks = absent('JSON Schema conversion');
export const initializeContext = absent('JSON Schema conversion');
export const handleUnrepresentable = absent('JSON Schema conversion');
export const processSchema = absent('JSON Schema conversion');
export const extractDefs = absent('JSON Schema conversion');
export const finalize = absent('JSON Schema conversion');
export const allProcessors = {};
export class JSONSchemaGenerator {
  constructor() {
    absent('JSONSchemaGenerator')();
  }
}
