// vega-statistics ships no type declarations; this is the one function used, with its real signature.
declare module 'vega-statistics' {
  export function quantileNormal(p: number, mean?: number, stdev?: number): number;
}
