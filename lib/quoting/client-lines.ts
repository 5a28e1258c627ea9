/**
 * What a client sees of the bureau's pricing: each line at its price to them, with the bureau's
 * margin spread over the lines in proportion to their amounts (largest remainder, so the lines
 * still add up to the cent). No margin line, no internal rates.
 */
export function spreadMargin<T extends { amountCents: number }>(lines: T[], marginCents: number): (T & { amountCents: number })[] {
  const base = lines.reduce((s, l) => s + Math.max(0, l.amountCents), 0);
  if (base <= 0 || marginCents === 0) return lines.map((l) => ({ ...l }));
  const shares = lines.map((l) => (Math.max(0, l.amountCents) / base) * marginCents);
  const floors = shares.map(Math.floor);
  let left = marginCents - floors.reduce((s, v) => s + v, 0);
  const order = shares.map((s, i) => [s - floors[i]!, i] as const).sort((a, b) => b[0] - a[0]);
  for (const [, i] of order) {
    if (left <= 0) break;
    floors[i]! += 1;
    left -= 1;
  }
  return lines.map((l, i) => ({ ...l, amountCents: l.amountCents + floors[i]! }));
}
