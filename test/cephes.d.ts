/**
 * The `cephes` package (npm; a WebAssembly build of the Cephes library): only what the tests
 * use. Its own index.d.ts is not reached through its package.json "exports".
 */
declare module 'cephes' {
  const cephes: {
    /** Resolves once the WebAssembly module is compiled (at once in Node). */
    readonly compiled: Promise<void>;
    /** The exponentially scaled modified Bessel function e^(-x) I_0(x). */
    i0e(x: number): number;
  };
  export default cephes;
}
