/** The part of jStat 1.9.6 the engine uses (the package ships no type declarations). */
declare module 'jstat' {
  const jstat: {
    jStat: {
      normal: { inv(p: number, mean: number, sd: number): number; cdf(x: number, mean: number, sd: number): number };
    };
  };
  export default jstat;
}
