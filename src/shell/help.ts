/** Usage text and the safety notice, shared by --help and the README. */

export const SAFETY_NOTICE = `Safety: dctriage advises; it does not make equipment safe. Before touching conductors,
isolate, lock off and prove dead (test the tester before and after). Live tests are for
qualified persons only. A turning shaft makes a DC machine a generator; drive DC links hold
charge after isolation. Local regulations, site procedures and licensed practice prevail.`;

export const USAGE = `dctriage - find faults on DC machines, fast and safely

Usage:
  dctriage                              the guided dialogue (needs a terminal)
  dctriage expect FILE [--json]         what a healthy machine would read, against the readings
  dctriage diagnose FILE [--json]       ranked causes, ordered checks and isolation steps
  dctriage cases check [DIR] [--json]   every recorded case: where its confirmed cause ranks
  dctriage --help | --version

Options:
  --rules DIR   use this rule folder instead of the built-in one
  --json        machine-readable output on stdout

FILE is a dc-case/1 JSON file (schema: schemas/dc-case-1.schema.json).
Exit codes: 0 done, 1 findings (cases check: a case outside its top 3), 2 bad input.

${SAFETY_NOTICE}`;
