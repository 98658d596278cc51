/**
 * Bulk (Dörfler) marking: the smallest set M of elements, taken in descending order of their
 * indicator, with Σ_{T∈M} η_T² ≥ θ Σ_T η_T². Here θ multiplies the squared indicators
 * (papers also write θ² or 1 − θ for the same idea).
 * W. Dörfler, "A convergent adaptive algorithm for Poisson's equation", SIAM J. Numer. Anal. 33
 * (1996) 1106–1124.
 */
export function dorflerMark(indicatorSq: ArrayLike<number>, theta: number): Int32Array {
  if (!(theta > 0 && theta <= 1)) throw new RangeError(`Dörfler parameter θ must lie in (0, 1], got ${theta}`);
  const n = indicatorSq.length;
  const order = Int32Array.from({ length: n }, (_, i) => i).sort((a, b) => indicatorSq[b] - indicatorSq[a]);
  let total = 0;
  for (let i = 0; i < n; i++) total += indicatorSq[i];
  const goal = theta * total;
  let sum = 0;
  let k = 0;
  while (k < n && (sum < goal || k === 0)) sum += indicatorSq[order[k++]];
  return order.slice(0, k);
}
