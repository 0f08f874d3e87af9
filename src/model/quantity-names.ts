/** Every quantity the model can compute, with the words a fitter reads it by. */
export const QUANTITY_LABELS = {
  armatureCircuitResistance: 'armature circuit resistance',
  ratedBackEmf: 'rated back-EMF',
  machineConstant: 'machine constant kΦ',
  ratedTorque: 'rated torque',
  ratedArmatureCurrent: 'armature current vs rated',
  ratedArmatureVoltage: 'armature voltage vs rated',
  cableDrop: 'terminal vs supply voltage',
  ratedFieldVoltage: 'field voltage vs rated',
  fieldCurrent: 'field current',
  fieldCurrentAtMeasuredVoltage: 'field current at the field voltage measured',
  ratedFieldCurrent: 'field current vs rating',
  speed: 'speed',
  speedFromMeasuredField: 'speed with measured field',
  backEmf: 'back-EMF',
  torque: 'torque at measured current',
  speedRegulation: 'speed regulation',
  armatureWindingTemperature: 'armature winding temperature',
  armatureTemperatureLimit: 'armature temperature limit',
  armatureTemperatureRise: 'armature rise over coolant vs limit',
  fieldWindingTemperature: 'field winding temperature',
  fieldTemperatureLimit: 'field temperature limit',
  fieldTemperatureRise: 'field rise over coolant vs limit',
  insulationResistanceAt40C: 'insulation at 40 °C',
  insulationMinimum: 'insulation minimum',
  polarizationIndex: 'polarization index',
  polarizationIndexMinimum: 'polarization index minimum',
  speedReverse: 'speed reverse vs forward',
  maxSpeed: 'speed vs top of field weakening',
  tachoVoltage: 'tacho voltage',
  currentLimit: 'current limit vs rated',
  brushLength: 'brush length vs new',
  brushSpringPressure: 'spring pressure vs lowest',
  commutatorRunout: 'commutator runout vs limit',
  noLoadCurrent: 'no-load current vs normal',
  starterResistance: 'starter resistance left in at run',
} as const;

export type QuantityName = keyof typeof QUANTITY_LABELS;
export const QUANTITY_NAMES = Object.keys(QUANTITY_LABELS) as QuantityName[];

/**
 * The band a reading sits in on a healthy machine, as measured ÷ the quantity's value. Only
 * these are flagged in a readings table; the rest are references or derived values. A 10 %
 * band on expectations is common practice; limits flag on their wrong side only.
 */
export interface HealthyBand {
  low?: number;
  high?: number;
}

export const HEALTHY_BANDS: Partial<Record<QuantityName, HealthyBand>> = {
  fieldCurrent: { low: 0.9, high: 1.1 },
  fieldCurrentAtMeasuredVoltage: { low: 0.9, high: 1.1 },
  armatureTemperatureRise: { high: 1 },
  fieldTemperatureRise: { high: 1 },
  maxSpeed: { high: 1.02 },
  speed: { low: 0.9, high: 1.1 },
  ratedArmatureVoltage: { low: 0.9, high: 1.06 },
  ratedFieldVoltage: { low: 0.9, high: 1.06 },
  ratedFieldCurrent: { high: 1.1 },
  ratedArmatureCurrent: { high: 1.05 },
  cableDrop: { low: 0.95 },
  speedReverse: { low: 0.95, high: 1.05 },
  tachoVoltage: { low: 0.9, high: 1.1 },
  currentLimit: { low: 0.9 },
  brushLength: { low: 0.4 },
  brushSpringPressure: { low: 1 },
  commutatorRunout: { high: 1 },
  noLoadCurrent: { high: 1 },
};

/**
 * A controlled converter sets the armature voltage for the speed it is asked for, so below the
 * plate is normal there (common practice): only above the rating is out of band.
 */
export const CONVERTER_ARMATURE_VOLTAGE_BAND: HealthyBand = { high: 1.06 };

/** `band` is the machine's own band where the model gives one (see Quantity.band). */
export function outOfBand(name: QuantityName, ratio: number | null, band: HealthyBand | undefined = HEALTHY_BANDS[name]): boolean {
  if (!band || ratio === null) return false;
  return (band.low !== undefined && ratio < band.low) || (band.high !== undefined && ratio > band.high);
}
