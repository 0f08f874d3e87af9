/** What the rules see of the test series: codes on the `testFindings` fact (set in src/engine/series-analyses.ts). */

/** Finding codes the rules may test with `contains` on the `testFindings` fact. */
export const TEST_FINDINGS = [
  'bar-to-bar-even',
  'bar-to-bar-open',
  'bar-to-bar-high-resistance',
  'bar-to-bar-short',
  'bar-to-bar-ground',
  'pole-drop-shunt-field',
  'pole-drop-series-field',
  'pole-drop-interpole',
  'pole-drop-compensating',
  'pole-drop-ac',
  'pole-drop-dc',
  'pole-drop-even',
  'pole-drop-shorted-turns',
  'pole-drop-coil-shorted',
  'pole-drop-coil-open',
  'runout-over-limit',
  'runout-within-limit',
  'runout-bar-step',
  'insulation-curve-rising',
  'insulation-curve-flattens',
  'insulation-curve-falls',
  'insulation-below-minimum',
  'insulation-pi-low',
] as const;
export type TestFinding = (typeof TEST_FINDINGS)[number];

/** Series the dialogue can take as one typed line, a question each (questions.json, answer kind "series"). */
export const DIALOGUE_SERIES = ['barToBar', 'poleDrop', 'runout'] as const;
export type DialogueSeries = (typeof DIALOGUE_SERIES)[number];

/** The findings one answer to a series question can bring, for the question policy: each answer is one of these. */
export const SERIES_OUTCOMES: Record<DialogueSeries, readonly TestFinding[]> = {
  barToBar: ['bar-to-bar-even', 'bar-to-bar-open', 'bar-to-bar-high-resistance', 'bar-to-bar-short'],
  poleDrop: ['pole-drop-even', 'pole-drop-shorted-turns', 'pole-drop-coil-shorted', 'pole-drop-coil-open'],
  runout: ['runout-within-limit', 'runout-over-limit', 'runout-bar-step'],
};
