// The seeded generators live beside the demo scenario in src/ (the service's
// /docs examples draw from them); scripts and tests import them from here too.
export { seededNormal, seededUniform } from '../src/seeded-random.ts';
