/**
 * A cause's evidence as a person reads it: each thing seen said once. A rule whose words repeat
 * what an earlier line of the same cause said ("speed … 127 %; runs faster than it should" after
 * "runs faster than it should") keeps only what is new, and is left out when nothing is.
 */
export interface EvidenceLine {
  supports: boolean;
  says: string;
}

export function evidenceLines(evidence: readonly { weight: number; says: string }[]): EvidenceLine[] {
  const said = new Set<string>();
  const lines: EvidenceLine[] = [];
  for (const e of evidence) {
    const fresh: string[] = [];
    for (const part of e.says.split('; ')) {
      if (said.has(part)) continue;
      said.add(part);
      fresh.push(part);
    }
    if (!fresh.length) continue;
    lines.push({ supports: e.weight > 0, says: fresh.join('; ') });
  }
  return lines;
}
