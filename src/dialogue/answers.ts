/**
 * What the fitter typed, read against the question: a choice by number or word, several
 * symptoms, a quantity through the unit adapter, free text. Never throws: a value or a reason.
 */
import { describeQuantityError, DIMENSIONS, normalizeQuantityText, parseQuantity } from '../units/quantity.js';
import { quote } from '../units/quote.js';
import { spacedControls } from '../knowledge/visible-text.js';
import type { DialogueQuestion } from './questions.js';
import { editDistance as distance } from './edit-distance.js';
import { seriesFromText } from './series-answer.js';

export type AnswerValue = { kind: 'unknown' } | { kind: 'one'; value: string } | { kind: 'many'; values: string[] } | { kind: 'text'; value: string };

export type ParsedAnswer = { ok: true; value: AnswerValue; shown: string } | { ok: false; reason: string };

const UNKNOWN_WORDS = new Set(['', 'unknown', '?', '-', 'skip', 'dunno', "don't know", 'n/a', 'na']);
/** A choice, a quantity or a command is short; longer input is refused, never cut. */
export const MAX_ANSWER_LENGTH = 200;
/** Free text (a finding, notes) may be a pasted paragraph. */
export const MAX_TEXT_LENGTH = 2000;

export function cleanInput(text: string): string {
  // Control characters (pasted escape sequences, tabs, line breaks of a paste) become spaces; spaces are kept single.
  return spacedControls(text).replace(/\s+/g, ' ').trim();
}

/** Why an answer is too long to take, naming the limit; nothing is cut. Free text and a series (200 bar-to-bar readings) may be long. */
export function lengthProblem(text: string, long: boolean): string | undefined {
  const limit = long ? MAX_TEXT_LENGTH : MAX_ANSWER_LENGTH;
  if (text.length <= limit) return undefined;
  return `that is ${text.length} characters, and ${long ? 'text' : 'an answer'} here is limited to ${limit}: nothing was taken; shorten it and enter it again`;
}

export function parseAnswer(q: DialogueQuestion, typed: string): ParsedAnswer {
  const a = q.answer;
  const text = cleanInput(typed);
  const tooLong = lengthProblem(text, a.kind === 'text' || a.kind === 'series');
  if (tooLong) return { ok: false, reason: tooLong };
  if (UNKNOWN_WORDS.has(text.toLowerCase())) return { ok: true, value: { kind: 'unknown' }, shown: 'unknown' };
  switch (a.kind) {
    case 'series': {
      // Kept as typed, like a quantity; the job reads it into its tests (job.ts).
      const line = seriesFromText(a.series, text);
      if (!line.ok) return { ok: false, reason: line.reason };
      return { ok: true, value: { kind: 'text', value: text }, shown: `${line.count} readings: ${line.says}` };
    }
    case 'text':
      return { ok: true, value: { kind: 'text', value: text }, shown: text };
    case 'quantity': {
      // A bare number is in the unit the question shows; a base/top speed ("1750/2300") is kept as typed.
      const bare = /^[+-]?[\d.,]+$/.test(text);
      const stored = bare ? `${text} ${a.unit ?? DIMENSIONS[a.dimension].unit}` : text;
      const baseAndTop = a.dimension === 'speed' && /^[\d.,]+\s*\/\s*[\d.,]+\s*\S*$/.test(text);
      const r = parseQuantity(baseAndTop ? text.split('/')[0]!.trim() : stored, a.dimension);
      if (!r.ok) return { ok: false, reason: describeQuantityError(r.error) };
      const shown = bare ? stored : baseAndTop ? text : normalizeQuantityText(text, a.dimension).replace(/ degC$/, ' °C').replace(/ ohm$/, ' Ω');
      return { ok: true, value: { kind: 'text', value: stored }, shown };
    }
    case 'choice': {
      const pick = pickOption(a.options, text);
      if (!pick) return { ok: false, reason: `${quote(text)} is not one of the choices${suggestion(a.options, text)}: give its number (1–${a.options.length}) or its word` };
      return { ok: true, value: { kind: 'one', value: pick.value }, shown: pick.label };
    }
    case 'many': {
      const parts = text.split(/[\s,;]+/).filter(Boolean);
      const picks = parts.map((p) => ({ p, o: pickOption(a.options, p) }));
      const bad = picks.find((x) => !x.o);
      if (bad) return { ok: false, reason: `${quote(bad.p)} is not one of the choices${suggestion(a.options, bad.p)}: give numbers (1–${a.options.length}) separated by spaces` };
      const values = [...new Set(picks.map((x) => x.o!.value))];
      return { ok: true, value: { kind: 'many', values }, shown: values.map((v) => a.options.find((o) => o.value === v)!.label).join(', ') };
    }
  }
}

function pickOption(options: { value: string; label: string }[], text: string) {
  const t = text.toLowerCase();
  if (/^\d+$/.test(t)) return options[Number(t) - 1];
  return (
    options.find((o) => o.value === t || o.label.toLowerCase() === t) ??
    // A unique prefix of a value or label is enough: "ru" for running.
    unique(options.filter((o) => o.value.startsWith(t) || o.label.toLowerCase().startsWith(t))) ??
    // So is a unique word of a label: "blower" for "separate blower".
    (t.length >= 3 ? unique(options.filter((o) => o.label.toLowerCase().split(/[\s(),/]+/).some((w) => w.startsWith(t)))) : undefined)
  );
}

/** ' (did you mean "shunt"?)' when one choice is a slip of the keyboard away, or the choices a word fits. */
function suggestion(options: { value: string; label: string }[], text: string): string {
  const t = text.toLowerCase();
  if (t.length < 3 || t.length > 40) return '';
  const words = (o: { value: string; label: string }) => [o.value, ...o.label.toLowerCase().split(/[\s(),/]+/)].filter((w) => w.length >= 3);
  const near = options.filter((o) => words(o).some((w) => distance(t, w) <= (t.length <= 4 ? 1 : 2)));
  const containing = options.filter((o) => o.label.toLowerCase().includes(t));
  const fits = near.length ? near : containing;
  if (fits.length === 0 || fits.length > 3) return '';
  return ` (did you mean ${fits.map((o) => quote(o.label)).join(' or ')}?)`;
}

function unique<T>(xs: T[]): T | undefined {
  return xs.length === 1 ? xs[0] : undefined;
}
