// The demo scenario (a ceramics plant's tile shrinkage, invented), for the
// demo, the benchmarks and the tests; the generator itself is in
// src/demo-scenario.ts, where the OpenAPI document's examples draw from it too.
export { demoColumns, demoComparison } from '../src/demo-scenario.ts';
