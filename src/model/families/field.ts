/**
 * The field a healthy machine carries now. The reference is the plate's (hot) field current — or
 * the field regulator's set point where it is known — not a value scaled from the measured field
 * voltage, so a low field supply shows as a weak field. Where the field is fed from the armature
 * terminals (shunt, compound) the supply is the terminal voltage, and the reference follows it.
 * A voltage-fed field that is colder than its working temperature draws more than the plate
 * current; within a drive's field-weakening range the drive weakens the field on purpose.
 */
import { excitationForFlux } from '../magnetization.js';
import { inferredZero } from '../resistance.js';
import { addQuantity, assume, fmt, needs, rpmToRadS, type ModelContext } from './context.js';
import { warmResistance } from './rated-point.js';

/** Above base speed by more than this share, a drive with a top speed on its plate is field weakening. */
const FIELD_WEAKENING_MARGIN = 0.02;

export function healthyField(ctx: ModelContext): void {
  const { machine, readings, traits, derived: d } = ctx;
  if (!traits.shuntField) return;
  const np = machine.nameplate ?? {};
  const res = machine.resistances ?? {};
  const ratedVf = d.ratedFieldVoltage;
  const fieldSupply = shuntFieldSupply(ctx);
  const measuredVf = readings.fieldVoltage ?? (traits.fieldAcrossTerminals ? fieldSupply?.volts : undefined);
  if (ratedVf !== undefined) {
    addQuantity(ctx, 'ratedFieldVoltage', { value: ratedVf, unit: 'V', measured: measuredVf, formula: np.fieldVoltage !== undefined ? 'nameplate' : 'terminal voltage (field across the armature)' });
  }
  // The healthy field first, its rating after: a readings table shows the reading once, against the healthy value.
  const addRating = () => {
    if (d.ratedFieldCurrent !== undefined) addQuantity(ctx, 'ratedFieldCurrent', { value: d.ratedFieldCurrent, unit: 'A', measured: readings.fieldCurrent, formula: np.fieldCurrent !== undefined ? 'nameplate' : 'If = Vf/Rf at working temperature' });
  };
  if (!needs(ctx, 'fieldCurrent', { 'machine.nameplate.fieldCurrent or machine.resistances.shuntField': d.ratedFieldCurrent })) return addRating();
  const rated = d.ratedFieldCurrent!;

  let reference = rated;
  let formula = np.fieldCurrent !== undefined ? 'If = If,plate (the plate value is hot)' : 'If = Vf,rated/Rf at working temperature';
  const weakening = fieldWeakeningReference(ctx, rated);
  if (readings.fieldCurrentSetting !== undefined) {
    reference = readings.fieldCurrentSetting;
    formula = "the field regulator's set point";
  } else if (weakening !== undefined) {
    reference = weakening;
    formula = `field weakened by the drive above base speed: the field that keeps the armature at its rated ${fmt(np.armatureVoltage!, 'V')} at ${fmt(readings.speed!, 'rpm')}`;
    assume(ctx, `speed ${fmt(readings.speed!, 'rpm')} is within the plate's field-weakening range (${fmt(np.speed!, 'rpm')} to ${fmt(np.maxSpeed!, 'rpm')}): a field below its rating there is the drive's doing`);
  } else {
    if (traits.fieldAcrossTerminals && fieldSupply !== undefined && ratedVf !== undefined && ratedVf > 0) {
      // A shunt field is fed from the supply the machine gets: a healthy one follows that voltage.
      reference = (rated * fieldSupply.volts) / ratedVf;
      formula = `If = If,rated · V/V,rated (shunt field across ${fieldSupply.where})`;
    } else if (!traits.fieldAcrossTerminals && ratedVf !== undefined) {
      assume(ctx, `separately fed field: a healthy field supply gives its rated ${fmt(ratedVf, 'V')}, so a field current below the plate is a fault wherever it comes from`);
    }
    const temperature = readings.fieldTemperature;
    if (temperature !== undefined) {
      // A voltage-fed winding draws current in inverse proportion to its resistance.
      const k = inferredZero(machine.windingMaterial);
      const factor = (k + d.workC) / (k + temperature);
      reference *= factor;
      formula += `, × (k + ${d.workC})/(k + ${temperature}) for a field at ${fmt(temperature, '°C')} instead of its working ${d.workC} °C`;
    }
  }
  d.expectedField = reference;
  addQuantity(ctx, 'fieldCurrent', { value: reference, unit: 'A', measured: readings.fieldCurrent, formula });
  addRating();

  // The field winding itself, whatever its supply: the current its measured voltage should drive.
  const rWarm = warmResistance(ctx, res.shuntField);
  if (readings.fieldVoltage !== undefined && readings.fieldCurrentSetting === undefined && weakening === undefined) {
    const perVolt = ratedVf !== undefined && ratedVf > 0 ? rated / ratedVf : rWarm !== undefined ? 1 / rWarm : undefined;
    if (perVolt !== undefined) {
      addQuantity(ctx, 'fieldCurrentAtMeasuredVoltage', { value: perVolt * readings.fieldVoltage, unit: 'A', measured: readings.fieldCurrent, formula: 'If = If,rated · Vf/Vf,rated (the winding at the voltage measured across it)' });
    }
  }
}

/**
 * The voltage a shunt field sees. A starter puts its resistance between the supply and the
 * armature, with the shunt field on the supply side of it (as in three- and four-point starters),
 * so while a step is in, the field gets the supply voltage, not the lower terminal voltage.
 */
function shuntFieldSupply(ctx: ModelContext): { volts: number; where: string } | undefined {
  const { readings } = ctx;
  if ((readings.starterResistance ?? 0) > 0 && readings.supplyVoltage !== undefined) return { volts: readings.supplyVoltage, where: 'the supply, ahead of the starter resistance' };
  return readings.armatureVoltage === undefined ? undefined : { volts: readings.armatureVoltage, where: 'the terminals' };
}

/**
 * The field a healthy drive sets above base speed: the flux that keeps the armature at its rated
 * voltage at the measured speed, read back through the magnetisation curve. Undefined outside
 * the range or without what it needs.
 */
function fieldWeakeningReference(ctx: ModelContext, ratedField: number): number | undefined {
  const { machine, readings, derived: d } = ctx;
  const np = machine.nameplate ?? {};
  const n = readings.speed;
  if (np.maxSpeed === undefined || np.speed === undefined || n === undefined || np.armatureVoltage === undefined) return undefined;
  if (n <= np.speed * (1 + FIELD_WEAKENING_MARGIN) || n > np.maxSpeed * (1 + FIELD_WEAKENING_MARGIN)) return undefined;
  if (d.kPhiRated === undefined || d.circuitR === undefined) return undefined;
  const ia = readings.armatureCurrent ?? 0;
  const phi = Math.min(1, (np.armatureVoltage - ia * d.circuitR - (ia > 0 ? d.brushDrop : 0)) / (d.kPhiRated * rpmToRadS(n)));
  const pu = excitationForFlux(machine.magnetization, phi);
  return pu === undefined ? undefined : pu * ratedField;
}
