/** Nearest-rank quantile of sorted values (q in [0, 1]). */
export function quantile(sorted: number[], q: number): number {
  if (!sorted.length) return NaN;
  const i = Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1));
  return sorted[i]!;
}

export function summary(xs: number[]) {
  const s = [...xs].sort((a, b) => a - b);
  return { median: quantile(s, 0.5), p95: quantile(s, 0.95), n: s.length };
}
