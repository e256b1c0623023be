/** The part of npm `lzma-native` 8 that node-codecs.ts uses (the package ships no types). */
declare module 'lzma-native' {
  /** Decompress an .xz (or .lzma) buffer; the callback gets the result first, then an error (lzma-native's order). */
  export function decompress(input: Buffer, options: Record<string, unknown>, done: (result: Buffer, error?: Error) => void): void;
  const lzma: { decompress: typeof decompress };
  export default lzma;
}
