/**
 * Schemas of the rule folder: the cause catalogue, checks, questions, safety content, shared
 * conditions and the rule files of each fault family. All of it is data; nothing in it runs.
 */
import * as z from 'zod';
import { CONNECTIONS } from '../model/machine.js';
import { DIALOGUE_SERIES } from '../model/series/findings.js';
import { DRIVES, FEEDBACK } from './vocabulary.js';

const id = z.string().regex(/^[a-z0-9][a-z0-9-]{0,79}$/, 'expected a lower-case id: letters, digits and "-"');

/** Operators a rule may use. The "is…" family is false when the fact is unknown. */
export const OPERATORS = [
  'is',
  'isNot',
  'isOneOf',
  'isNoneOf',
  'equal',
  'greaterThan',
  'greaterThanInclusive',
  'lessThan',
  'lessThanInclusive',
  'contains',
  'doesNotContain',
] as const;

const factRef = z.strictObject({ fact: z.string().min(1), path: z.string().regex(/^\$\.[A-Za-z0-9]+$/, 'expected a path "$.name"').optional() });

const leaf = z.strictObject({
  fact: z.string().min(1),
  path: z.string().regex(/^\$\.[A-Za-z0-9]+(\.[A-Za-z0-9]+)?$/, 'expected a path "$.name" (or "$.name.field" for the fact fit)').optional(),
  operator: z.enum(OPERATORS),
  value: z.union([z.string(), z.number(), z.boolean(), z.array(z.string()), factRef]),
});

export type Leaf = z.infer<typeof leaf>;
export type Condition = Leaf | { all: Condition[] } | { any: Condition[] } | { not: Condition } | { condition: string };

export const conditionSchema: z.ZodType<Condition> = z.lazy(() =>
  z.union([
    leaf,
    z.strictObject({ all: z.array(conditionSchema).min(1) }),
    z.strictObject({ any: z.array(conditionSchema).min(1) }),
    z.strictObject({ not: conditionSchema }),
    z.strictObject({ condition: id }),
  ]),
);

const appliesTo = z.strictObject({
  connections: z.array(z.enum(CONNECTIONS)).min(1).optional(),
  drives: z.array(z.enum(DRIVES)).min(1).optional(),
  feedback: z.array(z.enum(FEEDBACK)).min(1).optional(),
});
export type AppliesTo = z.infer<typeof appliesTo>;

export const causeSchema = z.strictObject({
  id,
  title: z.string().min(1),
  description: z.string().min(1),
  /** Only these machines can have this fault; absent = all. */
  appliesTo: appliesTo.optional(),
  /** A broader cause this one narrows (a starter resistance open is an open armature circuit): jobs filed under either count for both. */
  refines: id.optional(),
  checks: z.array(id).min(1),
});
export const causesFile = z.strictObject({ causes: z.array(causeSchema).min(1) });

export const MACHINE_STATES = ['observe', 'live-test', 'isolated'] as const;
export type MachineState = (typeof MACHINE_STATES)[number];

export const checkSchema = z.strictObject({
  id,
  title: z.string().min(1),
  how: z.string().min(1),
  instrument: z.string().min(1),
  state: z.enum(MACHINE_STATES),
  hazards: z.array(id),
  minutes: z.number().positive().max(600),
  /** An insulation or winding test that clears a fault before anything is re-energised. */
  clearsFaultBeforeEnergising: z.boolean().optional(),
  /** The check needs the machine turning under power: never offered after a runaway warning. */
  running: z.boolean().optional(),
  /** Never offered where this holds (the machine, its load or a warning makes it unsafe); `says` tells the fitter why. */
  unsafeWhen: z.strictObject({ condition: conditionSchema, says: z.string().min(1) }).optional(),
  /** The safe check offered in its place where `unsafeWhen` holds. */
  instead: id.optional(),
  /** Hazards that apply only to some jobs (a suspended load, a differential compound machine). */
  cautions: z.array(z.strictObject({ when: conditionSchema, hazard: id })).optional(),
  /**
   * How reliably the check shows a cause it serves when that cause is present (0–1): a normal
   * result weighs against the cause in proportion, an abnormal one for it. Absent: a default by
   * the check's state (see src/engine/loop.ts). `sensitivityFor` sets it per cause.
   */
  sensitivity: z.number().gt(0).max(1).optional(),
  sensitivityFor: z.record(id, z.number().gt(0).max(1)).optional(),
  /** What the check measures or sees: the dialogue asks for these by name, with their units, when the check is done. */
  takes: z
    .strictObject({
      readings: z.array(z.string().min(1)).min(1).optional(),
      observations: z.array(z.string().min(1)).min(1).optional(),
    })
    .optional(),
});
/** A check no longer offered: its id stays reserved, so it is never reused for a different test. */
const retiredCheck = z.strictObject({ id, replacedBy: id.optional(), why: z.string().min(1) });
export const checksFile = z.strictObject({ checks: z.array(checkSchema).min(1), retired: z.array(retiredCheck).optional() });

const answer = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('choice'), observation: z.string().min(1) }),
  z.strictObject({ kind: z.literal('quantity'), reading: z.string().min(1) }),
  z.strictObject({ kind: z.literal('symptoms') }),
  /** A test series typed on one line (src/dialogue/series-answer.ts), into the case file's `tests`. */
  z.strictObject({ kind: z.literal('series'), series: z.enum(DIALOGUE_SERIES) }),
]);

export const questionSchema = z.strictObject({
  id,
  prompt: z.string().min(1),
  state: z.enum(MACHINE_STATES),
  answer,
  /** Ask only when this holds (e.g. a controlled drive). */
  askWhen: conditionSchema.optional(),
  /** When this holds, asked before anything the policy picks: the answer decides what is safe. */
  askFirstWhen: conditionSchema.optional(),
  /** Answering needs the machine running: not asked after a fault trip or a runaway warning. */
  needsRunning: z.boolean().optional(),
  /** Context before detail: asked only once these questions are answered (each asked first if need be). */
  askAfter: z.array(id).min(1).optional(),
  /** Asked so that checks are offered safely (what the machine drives): not counted against the question limit. */
  forSafety: z.boolean().optional(),
});
export const questionsFile = z.strictObject({ questions: z.array(questionSchema).min(1) });

export const safetyFile = z.strictObject({
  isolation: z.strictObject({
    source: z.string().min(1),
    steps: z.array(z.strictObject({ id, says: z.string().min(1) })).length(5),
    /** DC-specific steps; some apply only to some drives or connections. */
    dcSpecific: z.array(z.strictObject({ id, says: z.string().min(1), drives: z.array(z.enum(DRIVES)).min(1).optional(), connections: z.array(z.enum(CONNECTIONS)).min(1).optional() })),
    /**
     * The order of every step, the five rules and the DC-specific ones together: stored energy is
     * released before the absence of voltage is verified, and the field comes down only after the
     * armature circuit is open.
     */
    sequence: z.array(id).min(5),
    prevails: z.string().min(1),
    /** The US practice that matches the five rules. */
    usEquivalent: z.string().min(1),
  }),
  /** Steps before a repaired machine runs again, in order. */
  returnToService: z.array(z.strictObject({ id, says: z.string().min(1) })).min(1),
  hazards: z.array(z.strictObject({ id, says: z.string().min(1) })).min(1),
  warnings: z
    .array(
      z.strictObject({
        id,
        says: z.string().min(1),
        /** Nothing energised before isolated checks: the machine is not run again to look. */
        isolateFirst: z.boolean(),
        /** After a fault trip: the insulation and winding tests that clear the fault come first of all. */
        clearFaultFirst: z.boolean().optional(),
        /** The machine may run away: nothing that needs it running is offered until the cause is found isolated. */
        runaway: z.boolean().optional(),
        /** How it is shown: danger (someone can be hurt now) or caution. */
        severity: z.enum(['danger', 'caution']),
      }),
    )
    .min(1),
  notice: z.string().min(1),
});

export const sharedConditionsFile = z.strictObject({ conditions: z.record(id, conditionSchema) });

/** `source`: where the rule's knowledge comes from (a standard's clause, a textbook, a public manual, or "common practice"). */
const ruleBase = { name: id, conditions: conditionSchema, says: z.string().min(1).optional(), source: z.string().min(1).optional() };

export const ruleSchema = z.discriminatedUnion('kind', [
  /** Derives an intermediate fact (true) for other rules. */
  z.strictObject({ ...ruleBase, kind: z.literal('derive'), derive: id }),
  /** Evidence for (weight > 0) or against (weight < 0) a cause, as a certainty factor. */
  z.strictObject({ ...ruleBase, kind: z.literal('evidence'), cause: id, weight: z.number().min(-1).max(1).refine((w) => w !== 0, 'a weight of 0 says nothing') }),
  /** Rules a cause out altogether. */
  z.strictObject({ ...ruleBase, kind: z.literal('rule-out'), cause: id }),
  /** Raises a safety warning shown before any cause. */
  z.strictObject({ ...ruleBase, kind: z.literal('warning'), warning: id }),
]);
export type Rule = z.infer<typeof ruleSchema>;

export const ruleFile = z.strictObject({
  family: z.string().min(1),
  description: z.string().min(1).optional(),
  rules: z.array(ruleSchema).min(1),
});

/** A draft in drafts/: a rule file that may also bring a new cause and its checks. */
export const draftFile = z.strictObject({
  ...ruleFile.shape,
  causes: z.array(causeSchema).optional(),
  checks: z.array(checkSchema).optional(),
});

export type DraftFile = z.infer<typeof draftFile>;
export type Cause = z.infer<typeof causeSchema>;
export type Check = z.infer<typeof checkSchema>;
export type Question = z.infer<typeof questionSchema>;
export type Safety = z.infer<typeof safetyFile>;
export type RetiredCheck = z.infer<typeof retiredCheck>;

/** The files of a rule folder that are not rule files. */
export const CATALOGUE_FILES = {
  'causes.json': causesFile,
  'checks.json': checksFile,
  'questions.json': questionsFile,
  'safety.json': safetyFile,
  'conditions.json': sharedConditionsFile,
} as const;
