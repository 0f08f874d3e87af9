import { describe, expect, it } from 'vitest';
import { all, create } from 'mathjs';
import { DIMENSIONS, normalizeQuantityText, parseQuantity, type Dimension } from '../../src/units/quantity.js';

// Reference: the full mathjs instance (general-purpose reference library), with the same two
// units added. The adapter builds a smaller instance with number-only pow, round, fix and equal;
// over every unit spelling below it must agree with the full one, value for value. The adapter
// asks mathjs once per unit for its conversion and applies it to each number: the same check
// holds that to what the full instance gives for the whole text.
if (!all) throw new Error('mathjs exports no `all` factories');
const full = create(all, {});
full.createUnit('rpm', '1 / min');
full.createUnit('megohm', '1 Mohm');

type Verdict = { kind: 'value'; value: number } | { kind: 'wrong-dimension' } | { kind: 'unreadable' };

function byFullMathjs(text: string, dimension: Dimension): Verdict {
  const target = DIMENSIONS[dimension].unit;
  try {
    const u = full.unit(normalizeQuantityText(text, dimension));
    if (u.value === null) return { kind: 'unreadable' };
    if (!u.equalBase(full.unit(target))) return { kind: 'wrong-dimension' };
    return { kind: 'value', value: u.toNumber(target) };
  } catch {
    return { kind: 'unreadable' };
  }
}

function byAdapter(text: string, dimension: Dimension): Verdict | { kind: 'negative' } {
  const r = parseQuantity(text, dimension);
  if (r.ok) return { kind: 'value', value: r.value };
  switch (r.error.code) {
    case 'wrong-dimension':
      return { kind: 'wrong-dimension' };
    case 'out-of-range':
      return { kind: 'value', value: r.error.value };
    case 'negative':
      return { kind: 'negative' };
    default:
      return { kind: 'unreadable' };
  }
}

function agree(ours: Verdict | { kind: 'negative' }, theirs: Verdict): boolean {
  if (ours.kind === 'negative') return theirs.kind === 'value' && theirs.value < 0;
  // The adapter keeps 12 significant digits, dropping conversion noise.
  if (ours.kind === 'value' && theirs.kind === 'value') return Math.abs(ours.value - theirs.value) <= 1e-11 * Math.abs(theirs.value);
  return ours.kind === theirs.kind;
}

const UNITS = ['V', 'A', 'ohm', 'W', 'hp', 'rpm', 'Hz', 'degC', 'degF', 'K', 'Pa', 'bar', 'psi', 'm', 'inch', 'ft', 'N m', 'J', 'megohm', 'Mohm', 's', 'min', 'A^2', 'V / A', 'W / A', '1 / s'];
const PREFIXES = ['', 'k', 'm', 'M', 'u', 'G'];
const NUMBERS = ['0', '1', '14.5', '230', '0.0035', '1e3', '-40', '2.5e-2', '1450'];

const spellings = new Set<string>();
for (const u of UNITS) for (const p of PREFIXES) for (const n of NUMBERS) spellings.add(`${n} ${/^[A-Za-z]/.test(u) ? `${p}${u}` : u}`);
const corpus = (Object.keys(DIMENSIONS) as Dimension[]).flatMap((dimension) => [...spellings].map((text): [string, Dimension] => [text, dimension]));

describe('the lean mathjs instance behind the unit adapter', () => {
  it(`agrees with the full mathjs on ${spellings.size} distinct spellings, each read in every dimension (${corpus.length} readings)`, () => {
    const disagreements: string[] = [];
    const kinds = { value: 0, 'wrong-dimension': 0, unreadable: 0 };
    for (const [text, dimension] of corpus) {
      const ours = byAdapter(text, dimension);
      const theirs = byFullMathjs(text, dimension);
      kinds[theirs.kind]++;
      if (!agree(ours, theirs)) disagreements.push(`${dimension} "${text}": adapter ${JSON.stringify(ours)}, full mathjs ${JSON.stringify(theirs)}`);
    }
    expect(disagreements).toEqual([]);
    // Each kind well represented: about a thousand conversions, the rest refusals of both kinds.
    expect(kinds.value).toBeGreaterThan(900);
    expect(kinds['wrong-dimension']).toBeGreaterThan(5000);
    expect(kinds.unreadable).toBeGreaterThan(1000);
  });

  it('converts temperatures, whose unit offsets mathjs keeps as fractions, as the full instance does', () => {
    for (const text of ['-40 degF', '212 degF', '0 K', '373.15 K', '40 degC', '98.6 degF', '155 degC']) {
      const theirs = byFullMathjs(text, 'temperature');
      expect(byAdapter(text, 'temperature')).toEqual(theirs);
      expect(theirs.kind).toBe('value');
    }
    // Reference: the definition of the Fahrenheit scale, -40 °F = -40 °C.
    expect(byAdapter('-40 degF', 'temperature')).toEqual({ kind: 'value', value: -40 });
  });
});
