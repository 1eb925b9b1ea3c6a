/**
 * Median of a sample (mean of the two middle values when n is even). O(n log n).
 * @throws RangeError for an empty sample.
 * @example median([3, 1, 2, 10]) // => 2.5
 */
export function median(values: ArrayLike<number>): number {
  if (values.length === 0) throw new RangeError('median: need at least one value');
  const sorted = Float64Array.from(values).sort();
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}
