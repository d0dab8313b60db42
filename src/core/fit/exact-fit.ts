// Detection of fits whose residuals are at rounding level.
//
// y itself is known only to double precision: each y_i carries a rounding of
// up to eps/2 |y_i|, so the vector of those roundings has norm <= (eps/2) ||y||
// whatever n is, and the least-squares residual of pure rounding (its projection
// off the column space) is no larger. Rounding of the design entries adds a
// similar term through X beta. EXACT_FIT_FACTOR * eps * ||sqrt(w) y|| leaves a
// margin of 128x above the y-rounding level for that and for modest cancellation,
// while a data set with genuine scatter sits many orders above it (NIST
// Wampler3, the mildest non-exact Wampler, has ||e|| / ||y|| = 1.8e-3; Wampler2,
// an exact fit in decimal, leaves 2.6e-17 from the rounding of its y, 550x below).

const EPS = 2 ** -52;
export const EXACT_FIT_FACTOR = 64;

/** True when ||sqrt(w) e|| <= 64 eps ||sqrt(w) y|| (norms of the weighted vectors). */
export function isExactFit(weightedResidualNorm: number, weightedResponseNorm: number): boolean {
  return weightedResidualNorm <= EXACT_FIT_FACTOR * EPS * weightedResponseNorm;
}
