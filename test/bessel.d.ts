/** The `bessel` package (npm, SheetJS): only what the tests use. */
declare module 'bessel' {
  const bessel: {
    /** Modified Bessel function of the first kind I_n(x). */
    besseli(x: number, n: number): number;
  };
  export default bessel;
}
