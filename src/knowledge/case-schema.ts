/**
 * The dc-case/1 file: one job, its machine, what was reported and measured, and once solved what
 * the cause was. Strict objects: an unknown field is an error naming it. Quantities are converted
 * by the unit adapter into plain numbers in each field's default unit.
 */
import * as z from 'zod';
import { CONNECTIONS, INSULATION_CLASSES, INSULATION_SYSTEMS, TESTED_WINDINGS } from '../model/machine.js';
import { WINDING_MATERIALS } from '../model/resistance.js';
import { describeQuantityError, DIMENSIONS, parseQuantity, type Dimension } from '../units/quantity.js';
import { quantityPattern } from '../units/quantity-pattern.js';
import { testsSchema } from './tests-schema.js';
import { COOLING, DRIVES, FEEDBACK, OBSERVATIONS, OBSERVATION_NAMES, SYMPTOM_IDS, SYMPTOMS, observationValues } from './vocabulary.js';

export const SAFE_ID = /^[A-Za-z0-9][A-Za-z0-9._-]{0,79}$/;
export const CASE_FORMAT = 'dc-case/1';

/** A quantity: a string with a unit, or a bare number in the dimension's default unit. */
export function quantity(dimension: Dimension, description: string) {
  const unit = DIMENSIONS[dimension].unit;
  return z
    .union([z.string().meta({ pattern: quantityPattern(dimension) }), z.number()], { error: `expected a quantity such as "12 ${unit}" or a number in ${unit}` })
    .transform((raw, ctx) => {
      const parsed = parseQuantity(raw, dimension);
      if (parsed.ok) return parsed.value;
      ctx.addIssue({ code: 'custom', message: describeQuantityError(parsed.error), input: raw });
      return z.NEVER;
    })
    .meta({ description: `${description} (default unit ${unit})` });
}

const safeId = z.string().regex(SAFE_ID, 'expected a safe id: letters, digits, ".", "_" or "-", starting with a letter or digit, at most 80 characters');

/** A drive motor's plate gives base and top speed as "1750/2300 r/min": both fields from one. */
const BASE_AND_TOP = /^\s*([0-9]+(?:[.,][0-9]+)?)\s*\/\s*([0-9]+(?:[.,][0-9]+)?)\s*(.*)$/;
function splitBaseAndTopSpeed(raw: unknown): unknown {
  if (typeof raw !== 'object' || raw === null || !('speed' in raw)) return raw;
  const plate = raw as Record<string, unknown>;
  const m = typeof plate.speed === 'string' ? BASE_AND_TOP.exec(plate.speed) : null;
  if (!m || plate.maxSpeed !== undefined) return raw;
  const unit = m[3]!.trim();
  return { ...plate, speed: unit ? `${m[1]} ${unit}` : m[1], maxSpeed: unit ? `${m[2]} ${unit}` : m[2] };
}

/** A rated value: the model divides by it, so zero is refused by name rather than computed into NaN. */
function rated(dimension: Dimension, description: string) {
  return quantity(dimension, description).refine((v) => v > 0, { error: 'a rated value of 0 cannot be used: the expected readings are worked out per unit of it; leave the field out if it is not known' });
}

const nameplateFields = z.strictObject({
  armatureVoltage: rated('voltage', 'rated armature voltage').optional(),
  armatureCurrent: rated('current', 'rated armature current').optional(),
  lineCurrent: rated('current', 'rated supply current, armature and shunt field together').optional(),
  speed: rated('speed', 'rated (full-load) speed, or base and top speed written as "1750/2300 r/min"').optional(),
  maxSpeed: rated('speed', 'top of the field-weakening range (drive motors)').optional(),
  noLoadSpeed: rated('speed', 'no-load speed').optional(),
  noLoadCurrent: rated('current', 'no-load armature current at rated voltage, from the plate or the test sheet').optional(),
  power: rated('power', 'rated output').optional(),
  fieldVoltage: rated('voltage', 'rated field voltage').optional(),
  fieldCurrent: rated('current', 'rated (hot) field current').optional(),
  insulationClass: z.enum(INSULATION_CLASSES).optional().meta({ description: 'thermal class (IEC 60085)' }),
});
const nameplate = z.preprocess(splitBaseAndTopSpeed, nameplateFields);

const resistances = z.strictObject({
  armature: quantity('resistance', 'armature circuit A1–A2: winding, interpoles and compensating winding, brushes excluded').optional(),
  shuntField: quantity('resistance', 'shunt or separately excited field').optional(),
  seriesField: quantity('resistance', 'series field').optional(),
  interpole: quantity('resistance', 'interpole winding (already part of the armature circuit)').optional(),
  at: quantity('temperature', 'winding temperature when measured').optional(),
});

const magnetization = z
  .union([z.literal('linear'), z.array(z.tuple([z.number().min(0), z.number().min(0)])).min(2)], {
    error: 'expected "linear" or a list of at least two [fieldCurrentPerUnit, fluxPerUnit] pairs',
  })
  .meta({ description: 'flux against exciting current, per unit of rated' });

export const machineSchema = z.strictObject({
  connection: z.enum(CONNECTIONS).meta({ description: 'how the field is connected' }),
  drive: z.enum(DRIVES).optional().meta({ description: 'what feeds the armature (absent = unknown)' }),
  feedback: z.enum(FEEDBACK).optional().meta({ description: 'speed feedback of a controlled drive (absent = unknown)' }),
  tachoVoltsPer1000Rpm: z.number().positive().max(1000).optional().meta({ description: 'tacho generator constant: volts at 1000 r/min' }),
  cooling: z.enum(COOLING).optional().meta({ description: 'how the machine is cooled (absent = unknown)' }),
  nameplate: nameplate.optional().meta({ description: 'rated values from the rating plate, as written on it' }),
  resistances: resistances.optional().meta({ description: 'winding resistances measured cold, with the temperature they were measured at' }),
  magnetization: magnetization.optional(),
  brushDrop: quantity('voltage', 'total brush contact drop').optional(),
  starterSteps: z.array(quantity('resistance', 'one step of the armature starter')).min(1).max(20).optional().meta({ description: 'resistance of each starter step, first (cut out first) to last' }),
  insulationSystem: z.enum(INSULATION_SYSTEMS).optional().meta({ description: 'thermosetting (epoxy, polyester; the default) or thermoplastic (asphaltic, shellac): IEEE 43-2013 corrects them differently' }),
  windingMaterial: z.enum(WINDING_MATERIALS).optional().meta({ description: 'copper (the default) or aluminium windings, for resistance against temperature' }),
});

/** Quantity readings of dc-case/1: the dimension each takes and what it is. */
export const READING_FIELDS = {
  armatureVoltage: { dimension: 'voltage', says: "the machine's terminal voltage" },
  supplyVoltage: { dimension: 'voltage', says: 'voltage at the supply or drive end' },
  starterResistance: { dimension: 'resistance', says: 'starter or external resistance still in the armature circuit at the step the starter is on (0 at run)' },
  armatureCurrent: { dimension: 'current', says: 'armature current' },
  fieldVoltage: { dimension: 'voltage', says: 'field voltage' },
  fieldCurrent: { dimension: 'current', says: 'shunt or separate field current' },
  fieldCurrentSetting: { dimension: 'current', says: "field regulator's current set point" },
  fieldTemperature: { dimension: 'temperature', says: 'field winding temperature while running readings were taken' },
  lineCurrent: { dimension: 'current', says: 'supply current (armature and shunt field)' },
  speed: { dimension: 'speed', says: 'speed' },
  speedReverse: { dimension: 'speed', says: 'speed at the same set-point in the other direction' },
  noLoadArmatureCurrent: { dimension: 'current', says: 'armature current running uncoupled' },
  uncoupledSpeed: { dimension: 'speed', says: 'speed running uncoupled, on the same supply' },
  ambientTemperature: { dimension: 'temperature', says: 'ambient or coolant temperature' },
  armatureResistanceHot: { dimension: 'resistance', says: 'armature circuit resistance measured hot' },
  shuntFieldResistanceHot: { dimension: 'resistance', says: 'shunt field resistance measured hot' },
  insulationResistance1min: { dimension: 'insulation', says: 'insulation resistance after 1 minute' },
  insulationResistance10min: { dimension: 'insulation', says: 'insulation resistance after 10 minutes' },
  insulationTestTemperature: { dimension: 'temperature', says: 'winding temperature during the insulation test' },
  insulationTestVoltage: { dimension: 'voltage', says: 'insulation tester voltage' },
  tachoVoltage: { dimension: 'signedVoltage', says: 'tacho generator output' },
  currentLimitSetting: { dimension: 'current', says: "drive's armature current limit" },
  brushLength: { dimension: 'length', says: 'shortest brush length' },
  brushLengthNew: { dimension: 'length', says: 'length of a new brush' },
  brushSpringPressure: { dimension: 'pressure', says: 'brush spring pressure' },
  commutatorRunout: { dimension: 'length', says: 'commutator runout (TIR)' },
} as const satisfies Record<string, { dimension: Dimension; says: string }>;
export type ReadingName = keyof typeof READING_FIELDS;

const readingShape = {
  ...(Object.fromEntries(Object.entries(READING_FIELDS).map(([k, f]) => [k, quantity(f.dimension, f.says)])) as { [K in ReadingName]: ReturnType<typeof quantity> }),
  insulationTestedWinding: z.enum(TESTED_WINDINGS).meta({ description: 'the winding the insulation readings were taken on' }),
};
export const readingsSchema = z.strictObject(
  Object.fromEntries(Object.entries(readingShape).map(([k, s]) => [k, s.optional()])) as {
    [K in keyof typeof readingShape]: z.ZodOptional<(typeof readingShape)[K]>;
  },
);

const observationsSchema = z.strictObject(
  Object.fromEntries(
    OBSERVATION_NAMES.map((name) => [name, z.enum(observationValues(name)).optional().meta({ description: OBSERVATIONS[name].says })]),
  ) as Record<(typeof OBSERVATION_NAMES)[number], z.ZodOptional<z.ZodEnum>>,
);

const isolation = z.strictObject({
  points: z.array(z.string()).optional().meta({ description: 'where the machine was isolated (breakers, isolators, fuses)' }),
  locks: z.array(z.string()).optional().meta({ description: 'lock or tag numbers applied' }),
  provedDeadBy: z.string().optional().meta({ description: 'who proved the machine dead' }),
  tester: z.string().optional().meta({ description: 'the voltage tester used to prove it dead' }),
});

const job = z.strictObject({
  workOrder: z.string().optional().meta({ description: 'the work order number' }),
  asset: z.string().optional().meta({ description: 'the machine as the site names it; a case filed without an id takes its id from this' }),
  site: z.string().optional().meta({ description: 'where the machine is' }),
  fitter: z.string().optional().meta({ description: 'who did the job' }),
  startedAt: z.string().optional().meta({ description: 'when the job started, as written' }),
  permit: z.string().optional().meta({ description: 'the permit to work, if one was issued' }),
  isolation: isolation.optional().meta({ description: 'how the machine was made safe' }),
  /** A lead's review: who closed the job and when. */
  closedBy: z.string().min(1).optional().meta({ description: "the lead who closed the job (dctriage review --close)" }),
  closedAt: z.string().optional().meta({ description: 'when the job was closed (ISO 8601 time, UTC)' }),
});

const outcome = z.strictObject({
  cause: safeId.optional().meta({ description: 'the confirmed cause: an id of the cause catalogue in use' }),
  newCause: z
    .strictObject({ id: safeId.meta({ description: 'a short id for the cause' }), title: z.string().min(1).meta({ description: 'its title, as a fitter would say it' }) })
    .optional()
    .meta({ description: 'a confirmed cause the catalogue does not have yet (instead of cause)' }),
  notes: z.string().optional().meta({ description: 'notes for the next fitter' }),
  fix: z.string().optional().meta({ description: 'what was done to put it right' }),
  date: z.iso.date({ error: 'expected a real date as YYYY-MM-DD' }).optional().meta({ description: 'the local date the job was solved, YYYY-MM-DD' }),
  recordedBy: z.string().optional().meta({ description: 'who recorded the outcome' }),
  readingsAfter: readingsSchema.optional().meta({ description: 'readings taken after the repair' }),
  returnedToServiceBy: z.string().optional().meta({ description: 'who returned the machine to service' }),
});

export const CHECK_RESULTS = ['normal', 'abnormal', 'inconclusive'] as const;

/** One check worked on the job, in the order worked: its result, what it measured and saw, who did it. */
const workedCheck = z.strictObject({
  id: z.string().regex(/^[a-z0-9][a-z0-9-]{0,79}$/, 'expected a check id of the rule folder in use').meta({ description: 'the check, by its id in checks.json' }),
  result: z.enum(CHECK_RESULTS).meta({ description: 'normal: nothing wrong where the check looks; abnormal: it shows a fault; inconclusive' }),
  readings: readingsSchema.optional().meta({ description: 'readings the check took, by the same names as the case file readings' }),
  observations: observationsSchema.optional().meta({ description: 'what the check saw, by the same names as the case file observations' }),
  tests: testsSchema.optional().meta({ description: 'test series the check took (bar-to-bar, pole drop, runout, insulation), as the case file tests' }),
  finding: z.string().max(4000).optional().meta({ description: 'what the check found, in the words of the person who did it' }),
  /** The fitter's own word that this check found the fault: the cause it confirms. */
  confirms: safeId.optional().meta({ description: "the cause this check's finding confirms, in the fitter's judgement" }),
  by: z.string().optional().meta({ description: 'who did the check' }),
  at: z.string().optional().meta({ description: 'when it was finished (ISO 8601 with offset)' }),
  startedAt: z.string().optional().meta({ description: 'when it was started (ISO 8601 with offset)' }),
  authorisedBy: z.string().optional().meta({ description: "for an apprentice's live or isolated check: the supervisor who authorised it" }),
  authorisation: z.enum(['present', 'remote']).optional().meta({ description: 'whether that supervisor was present or authorised it remotely' }),
  signedOffBy: z.string().optional().meta({ description: 'the supervisor who signed the check off' }),
  isolation: isolation.optional().meta({ description: 'how the machine was made safe, when this check was the first isolated one' }),
});
export type WorkedCheck = z.output<typeof workedCheck>;

export const caseSchema = z
  .strictObject({
    $schema: z.string().optional().meta({ description: 'the JSON Schema this file follows, for editors (e.g. "../schemas/dc-case-1.schema.json"); dctriage does not read it' }),
    format: z.literal(CASE_FORMAT).meta({ description: 'the file format and its version' }),
    id: safeId.optional().meta({ description: "the case's id: letters, digits, \".\", \"_\" or \"-\"" }),
    job: job.optional().meta({ description: 'the work order: who, where, when, and how the machine was made safe' }),
    machine: machineSchema.meta({ description: 'the machine: how it is connected and fed, its nameplate and resistances' }),
    symptoms: z
      .array(z.enum(SYMPTOM_IDS))
      .optional()
      .meta({ description: `zero or more of: ${Object.entries(SYMPTOMS).map(([k, v]) => `${k} (${v})`).join(', ')}` }),
    observations: observationsSchema.optional().meta({ description: 'what was seen, heard or checked, each by its name' }),
    readings: readingsSchema.optional().meta({ description: 'meter readings, as the meter showed them' }),
    tests: testsSchema.optional().meta({ description: 'test series brought back from the job: bar-to-bar, pole drop, runout, insulation over time' }),
    checks: z.array(workedCheck).max(500).optional().meta({ description: 'the checks worked, in order, with their results: the troubleshooting record' }),
    outcome: outcome.optional().meta({ description: 'once solved: the confirmed cause, the fix, the readings after the repair' }),
  })
  .meta({ id: 'dc-case-1', title: 'DC machine job (dc-case/1)' });

export type CaseFile = z.output<typeof caseSchema>;
export type CaseInput = z.input<typeof caseSchema>;
export type MachineFile = z.output<typeof machineSchema>;
