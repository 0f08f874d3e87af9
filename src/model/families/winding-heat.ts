/**
 * Winding temperature by resistance, judged as IEC 60034-1 judges it: the rise above the coolant
 * against the thermal class's rise limit, not the absolute temperature. The coolant is the
 * measured ambient; 40 °C (the standard's reference coolant) only where it is unknown, and the
 * assumption is said.
 */
import type { QuantityName } from '../quantity-names.js';
import { inferredZero, resistanceAt, windingTemperature } from '../resistance.js';
import { CLASS_TEMPERATURE_C, REFERENCE_COOLANT_C, RISE_LIMIT_K } from '../thermal.js';
import { addQuantity, assume, find, fmt, needs, type ModelContext } from './context.js';

interface Winding {
  label: 'armature' | 'field';
  hot: number | undefined;
  cold: number | undefined;
  coldField: string;
  temperature: QuantityName;
  limit: QuantityName;
  rise: QuantityName;
  lowMeans: string;
}

export function windingHeat(ctx: ModelContext): void {
  const { readings, machine } = ctx;
  const res = machine.resistances ?? {};
  const windings: Winding[] = [
    { label: 'armature', hot: readings.armatureResistanceHot, cold: res.armature, coldField: 'machine.resistances.armature', temperature: 'armatureWindingTemperature', limit: 'armatureTemperatureLimit', rise: 'armatureTemperatureRise', lowMeans: 'shorted turns, a bypassed section or a wrong reading' },
    { label: 'field', hot: readings.shuntFieldResistanceHot, cold: res.shuntField, coldField: 'machine.resistances.shuntField', temperature: 'fieldWindingTemperature', limit: 'fieldTemperatureLimit', rise: 'fieldTemperatureRise', lowMeans: 'shorted field turns or a wrong reading' },
  ];
  let coolantSaid = false;
  for (const w of windings) {
    if (w.hot === undefined) continue;
    if (!needs(ctx, w.temperature, { [w.coldField]: w.cold, 'machine.resistances.at': res.at })) continue;
    const k = inferredZero(machine.windingMaterial);
    const t = windingTemperature(w.hot, w.cold!, res.at!, k);
    addQuantity(ctx, w.temperature, { value: t, unit: 'degC', formula: `θ2 = (R2/R1)·(k + θ1) − k (resistance method, k = ${k} °C)` });
    const ambient = readings.ambientTemperature ?? res.at!;
    if (t < ambient - 5) {
      find(ctx, `${w.label}-resistance-low`, `hot ${w.label} resistance ${fmt(w.hot, 'Ω')} implies ${fmt(t, '°C')}, below ambient: ${w.lowMeans}`);
      // The interpoles are part of A1–A2: losing about their share points at them, not the armature.
      const lost = resistanceAt(w.cold!, res.at!, ambient, k) - w.hot;
      if (w.label === 'armature' && res.interpole !== undefined && lost >= 0.5 * res.interpole) {
        find(ctx, 'armature-circuit-lost-interpole-share', `the armature circuit reads ${fmt(lost, 'Ω')} less than it should, comparable with the ${fmt(res.interpole, 'Ω')} interpole winding: the interpoles look shorted or bypassed`);
      }
    }
    const cls = machine.nameplate?.insulationClass;
    if (!needs(ctx, w.limit, { 'machine.nameplate.insulationClass': cls })) continue;
    const coolant = readings.ambientTemperature ?? REFERENCE_COOLANT_C;
    if (readings.ambientTemperature === undefined && !coolantSaid) {
      assume(ctx, `coolant (ambient) temperature not given: taken as the ${REFERENCE_COOLANT_C} °C reference coolant of IEC 60034-1, which is lenient on a cooler day`);
      coolantSaid = true;
    }
    const riseLimit = RISE_LIMIT_K[cls!];
    const source = `IEC 60034-1 rise limit ${riseLimit} K, class ${cls}`;
    addQuantity(ctx, w.limit, { value: coolant + riseLimit, unit: 'degC', formula: `coolant ${fmt(coolant, '°C')} + ${source}` });
    addQuantity(ctx, w.rise, { value: riseLimit, unit: 'K', measured: t - coolant, formula: `θ − θcoolant against the ${source}` });
    if (t - coolant > riseLimit) {
      find(ctx, `${w.label}-rise-over-limit`, `${w.label} winding at ${fmt(t, '°C')} by resistance is ${fmt(t - coolant, 'K')} over the ${fmt(coolant, '°C')} coolant: class ${cls} allows ${riseLimit} K (IEC 60034-1)`);
    }
    if (t > CLASS_TEMPERATURE_C[cls!] + 60) {
      find(ctx, `${w.label}-resistance-high`, `hot ${w.label} resistance ${fmt(w.hot, 'Ω')} implies ${fmt(t, '°C')}, beyond any temperature the winding survives: a high-resistance joint or connection is more likely`);
    }
  }
}
