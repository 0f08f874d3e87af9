/**
 * A test series typed on one line, as a fitter reads it off the notebook:
 *   bar-to-bar  "1.9 1.9 41 1.9 1.9 mV lap 4-pole"   (a resistance unit means the resistance method)
 *   pole drop   "55 55.2 41 54.8 V ac"                (volts per coil; "ac" or "dc"; shunt field unless
 *                                                      "series", "interpole" or "compensating" is said)
 *   runout      "0 0.01 0.02 0.01 -0.005 mm"
 * A reading may carry its own unit ("0.0021V"). The line becomes the case file's `tests` entry,
 * checked by the same schema as a file, so a bad line gets the same message.
 */
import { testsSchema, type TestsFile } from '../knowledge/tests-schema.js';
import { analyseBarToBar } from '../model/series/bar-to-bar.js';
import { analysePoleDrop } from '../model/series/pole-drop.js';
import { analyseRunout } from '../model/series/runout.js';
import type { DialogueSeries } from '../model/series/findings.js';
import { parseQuantity } from '../units/quantity.js';

const NUMBER = /^[+-]?(\d+[.,]?\d*|[.,]\d+)(e[+-]?\d+)?$/i;
const WITH_UNIT = /^[+-]?(\d+[.,]?\d*|[.,]\d+)(e[+-]?\d+)?[^\d\s.,+-].*$/i;
const FIELD_WORDS = { series: 'series-field', interpole: 'interpole', compensating: 'compensating', shunt: 'shunt-field' } as const;

export type SeriesLine = { ok: true; input: Record<string, unknown>; count: number; says: string } | { ok: false; reason: string };

/** The `tests` entry a typed line stands for, or why it cannot be read. */
export function seriesFromText(series: DialogueSeries, text: string): SeriesLine {
  const tokens = text.split(/[\s;]+/).filter(Boolean);
  const values: (string | number)[] = [];
  const words: string[] = [];
  for (const t of tokens) {
    if (NUMBER.test(t)) values.push(Number(t.replace(',', '.')));
    else if (WITH_UNIT.test(t)) values.push(t);
    else words.push(t);
  }
  const lower = words.map((w) => w.toLowerCase());
  const unitWord = words.find((w) => !/^(ac|dc|lap|wave|\d+-?poles?|series|interpole|compensating|shunt)$/i.test(w));
  let input: Record<string, unknown>;
  if (series === 'barToBar') {
    const unit = unitWord ?? firstUnit(values);
    if (!unit) return { ok: false, reason: 'give the unit of the readings after them, e.g. "1.9 1.9 41 1.9 mV"' };
    const resistance = parseQuantity(`1 ${unit}`, 'resistance').ok;
    const poles = lower.map((w) => /^(\d+)-?poles?$/.exec(w)?.[1]).find(Boolean);
    input = {
      method: resistance ? 'resistance' : 'voltage-drop',
      unit,
      winding: lower.includes('wave') ? 'wave' : lower.includes('lap') ? 'lap' : 'unknown',
      ...(poles ? { poles: Number(poles) } : {}),
      values,
    };
  } else if (series === 'poleDrop') {
    const supply = lower.includes('ac') ? 'ac' : lower.includes('dc') ? 'dc' : undefined;
    if (!supply) return { ok: false, reason: 'say whether the test supply was ac or dc, e.g. "55 55 41 55 V ac"' };
    const winding = (Object.keys(FIELD_WORDS) as (keyof typeof FIELD_WORDS)[]).find((w) => lower.includes(w));
    input = { supply, winding: FIELD_WORDS[winding ?? 'shunt'], values: unitWord ? values.map((v) => (typeof v === 'number' ? `${v} ${unitWord}` : v)) : values };
  } else {
    const unit = unitWord ?? firstUnit(values) ?? 'mm';
    input = { unit, values };
  }
  const checked = testsSchema.safeParse({ [series]: input });
  if (!checked.success) {
    const first = checked.error.issues[0]!;
    const where = first.path.slice(1).filter((p) => typeof p === 'number');
    return { ok: false, reason: `${first.message}${where.length && !first.message.startsWith('reading') ? ` (reading ${Number(where[0]) + 1})` : ''}` };
  }
  return { ok: true, input, count: values.length, says: summary(checked.data) };
}

/** What the series shows at a glance, for the transcript line of the answer. */
function summary(t: TestsFile): string {
  if (t.barToBar) return analyseBarToBar(t.barToBar).pattern;
  if (t.poleDrop) {
    const s = analysePoleDrop(t.poleDrop).suspects;
    return s.length ? s.map((x) => `coil ${x.coil} ${x.kind.replace('-', ' ')} (${Math.round(x.deviation * 100)} %)`).join(', ') : 'every coil within 8 % of the median';
  }
  if (t.runout) {
    // The limit is judged with the machine, in the result; here only the size and the shape.
    const r = analyseRunout(t.runout, Infinity);
    return `TIR ${r.tir} ${t.runout.unit}, largest step ${r.maxStep} ${t.runout.unit}`;
  }
  return '';
}

/** The unit written on the first reading that carries one ("41mV" → "mV"). */
function firstUnit(values: readonly (string | number)[]): string | undefined {
  const withUnit = values.find((v): v is string => typeof v === 'string');
  return withUnit?.replace(/^[+-]?[\d.,]+(e[+-]?\d+)?\s*/i, '');
}

/** A case file's series as the line a fitter would type, for replaying a case through the dialogue. */
export function seriesToText(series: DialogueSeries, raw: Record<string, unknown>): string {
  const values = (Array.isArray(raw.values) ? raw.values : []).map((v) => String(v).replace(/\s+/g, ''));
  const extra =
    series === 'barToBar'
      ? [String(raw.unit), raw.winding === 'unknown' ? '' : String(raw.winding), raw.poles ? `${String(raw.poles)}-pole` : '']
      : series === 'poleDrop'
        ? [String(raw.supply), String(raw.winding).replace('-field', '')]
        : [String(raw.unit)];
  return [...values, ...extra].filter(Boolean).join(' ');
}
