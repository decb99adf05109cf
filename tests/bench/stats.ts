/** Small statistics shared by the bench sections (kept apart so sections can import it without a cycle). */
export function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** Ratios of rounds (the API section's windows)' ratios: median, middle half and range, for the note beside a row. */
export function ratioSpread(ratios: number[]): { median: number; note: string } {
  const sorted = [...ratios].sort((a, b) => a - b);
  const quartile = (q: number) => sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))].toFixed(2);
  return {
    median: median(sorted),
    note: `${sorted.length} rounds, middle half ${quartile(0.25)}–${quartile(0.75)}, all ${sorted[0].toFixed(2)}–${sorted[sorted.length - 1].toFixed(2)}`,
  };
}
