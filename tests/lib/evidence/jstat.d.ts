// Minimal types for the parts of jstat (npm, no bundled types) the cross-checks use.
declare module 'jstat' {
  export const jStat: {
    normal: { inv(p: number, mean: number, sd: number): number; cdf(x: number, mean: number, sd: number): number };
  };
}
