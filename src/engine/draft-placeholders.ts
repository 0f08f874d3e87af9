/**
 * The words a drafted cause or check carries until a lead writes the real ones. They must never
 * reach a fitter: `rules adopt` refuses a draft that still has them, and `rules check` reports
 * any in a rule folder.
 */
import type { Cause, Check } from '../knowledge/rulebase-schema.js';

export const PLACEHOLDER = {
  how: 'Describe how to confirm or clear this cause.',
  instrument: 'to be named',
  /** Ends a drafted cause's description. */
  description: '; describe it)',
} as const;

export interface PlaceholderText {
  /** "causes[0].description", "checks[1].how". */
  path: string;
  /** The cause or check id. */
  about: string;
  text: string;
}

/** Every field of these causes and checks that still holds a draft's placeholder. */
export function placeholderTexts(causes: readonly Cause[], checks: readonly Check[]): PlaceholderText[] {
  const found: PlaceholderText[] = [];
  causes.forEach((c, k) => {
    if (c.description.endsWith(PLACEHOLDER.description)) found.push({ path: `causes[${k}].description`, about: c.id, text: c.description });
  });
  checks.forEach((c, k) => {
    if (c.how.trim() === PLACEHOLDER.how) found.push({ path: `checks[${k}].how`, about: c.id, text: c.how });
    if (c.instrument.trim() === PLACEHOLDER.instrument) found.push({ path: `checks[${k}].instrument`, about: c.id, text: c.instrument });
  });
  return found;
}
