/** The parts of jStat (no published types) the tests use as a reference. */
declare module 'jstat' {
  const jStat: {
    studentt: { inv(p: number, df: number): number; cdf(t: number, df: number): number };
    mean(values: number[]): number;
    stdev(values: number[], sample?: boolean): number;
    transpose(matrix: number[][]): number[][];
    multiply(a: number[][], b: number[][]): number[][];
    inv(matrix: number[][]): number[][];
  };
  export default jStat;
}
