/** "Did you mean": how many single-letter edits turn one typed word into another. */

/**
 * Edits (insert, delete, change a letter, or swap two neighbours: "jsno" is one edit from "json")
 * that turn `a` into `b`. A typed word is short, so the plain table is enough.
 */
export function editDistance(a: string, b: string): number {
  let before: number[] = [];
  let prev = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const row = [i];
    for (let j = 1; j <= b.length; j++) {
      row[j] = Math.min(prev[j]! + 1, row[j - 1]! + 1, prev[j - 1]! + (a[i - 1] === b[j - 1] ? 0 : 1));
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) row[j] = Math.min(row[j]!, before[j - 2]! + 1);
    }
    before = prev;
    prev = row;
  }
  return prev[b.length]!;
}

/**
 * The words a slip of the keyboard away from `typed` (one edit for short words, two for longer).
 * @example nearWords('diagnsoe', ['diagnose', 'expect']) // ['diagnose']
 */
export function nearWords(typed: string, words: readonly string[]): string[] {
  const t = typed.toLowerCase();
  return words.filter((w) => editDistance(t, w.toLowerCase()) <= (t.length <= 4 ? 1 : 2));
}
