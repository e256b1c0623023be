/** Types for Esri's `lerc` 3 decoder (the package ships none). */
declare module 'lerc' {
  interface LercResult {
    width: number;
    height: number;
    pixels: ArrayLike<number>[];
    mask?: Uint8Array | null;
  }
  const Lerc: { decode(input: ArrayBuffer, options?: { inputOffset?: number; returnPixelInterleavedDims?: boolean }): LercResult };
  export default Lerc;
}
