// Types for the test-only reference library (CommonJS, app/blossom.js): van Rantwijk's
// maximum-weight matching ported to JavaScript. edges: [i, j, weight]; returns mate per vertex.
declare module 'edmonds-blossom-fixed' {
  function maxWeightMatching(edges: number[][], maxCardinality?: boolean): number[];
  export default maxWeightMatching;
}
