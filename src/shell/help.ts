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
  dctriage resume                       pick up an interrupted dialogue
  dctriage cases check [DIR] [--json]   every recorded case: where its confirmed cause ranks
  dctriage cases add FILE               file a solved job as a recorded case
  dctriage rules draft --from-case FILE draft a rule from a recorded case
  dctriage rules check [--json]         review the rule folder, then run every recorded case
  dctriage rules adopt DRAFT [--force]  move a reviewed draft into the rule folder
  dctriage review FILE [--close NAME]   a lead's review of a saved job: its report; --close marks it closed
  dctriage --help | --version

Options:
  --rules DIR     use this rule folder instead of the built-in one
  --cases DIR     the recorded cases to read or write
  --json          machine-readable output on stdout
  --adaptive      diagnose / cases check: ask the file only what the dialogue would ask
  --machine FILE  dialogue: take the machine from this file (a machine or a case file)
  --session FILE  dialogue: keep the session here
  --report FILE   dialogue, diagnose: write the job report (Markdown, or HTML for FILE.html)
                  to a new file; --force replaces an existing one
  --role ROLE     dialogue: fitter, apprentice (checks beyond looking need a supervisor) or lead
  --no-chart      expect, diagnose: leave out the speed–current chart

Without --rules/--cases, writing commands use DCTRIAGE_KNOWLEDGE, the "knowledge"
folder of ~/.config/dctriage/settings.json, or rules/ and cases/ of a checkout.

FILE is a dc-case/1 JSON file (schema: schemas/dc-case-1.schema.json).
Exit codes: 0 done, 1 findings (cases check: a case outside its top 3), 2 bad input,
70 internal error, 74 output could not be written; the dialogue also ends with
130 on Ctrl-C, 143 on SIGTERM, 129 when its terminal closes (the session is kept).

${SAFETY_NOTICE}`;
