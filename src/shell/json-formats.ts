/**
 * The name and version of each --json output, given as its top-level "format" key. The keys of
 * each are documented in docs/json-output.md; a change that removes or renames a key raises the
 * version, adding one does not.
 */
export const JSON_FORMATS = {
  expectation: 'dctriage-expectation/1',
  diagnosis: 'dctriage-diagnosis/1',
  caseCheck: 'dctriage-case-check/1',
  ruleCheck: 'dctriage-rule-check/1',
  ruleDraft: 'dctriage-rule-draft/1',
  history: 'dctriage-history/1',
} as const;
