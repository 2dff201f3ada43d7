/** The parts of jStat (no published types) the tests use as a reference. */
declare module 'jstat' {
  const jStat: {
    studentt: { inv(p: number, df: number): number; cdf(t: number, df: number): number };
    mean(values: number[]): number;
    stdev(values: number[], sample?: boolean): number;
  };
  export default jStat;
}
