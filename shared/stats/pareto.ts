// Pareto table: categories by count, largest first (ties in name order), with each category's
// share of the total and the running cumulative share. Shares are 0 when the total is 0.

export interface ParetoRow {
  name: string;
  count: number;
  share: number;
  cumulativeShare: number;
}

export function pareto(counts: Readonly<Record<string, number>>): ParetoRow[] {
  const entries = Object.entries(counts);
  for (const [name, count] of entries) {
    if (!Number.isFinite(count) || count < 0) {
      throw new RangeError(`pareto: count for "${name}" must be a number ≥ 0 (got ${count})`);
    }
  }
  // Code-unit order for names keeps the result identical on every platform and locale.
  entries.sort(([nameA, countA], [nameB, countB]) => countB - countA || (nameA < nameB ? -1 : nameA > nameB ? 1 : 0));

  const total = entries.reduce((sum, [, count]) => sum + count, 0);
  let runningCount = 0;
  return entries.map(([name, count]) => {
    runningCount += count;
    // Dividing the running count (not summing shares) keeps the last cumulative share exactly 1.
    return {
      name,
      count,
      share: total === 0 ? 0 : count / total,
      cumulativeShare: total === 0 ? 0 : runningCount / total,
    };
  });
}
