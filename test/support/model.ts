/** Builders shared by the model tests. */
import { computeExpectations, type ModelInput, type Quantity } from '../../src/model/expected.js';
import type { QuantityName } from '../../src/model/quantity-names.js';

export function quantityOf(input: ModelInput, name: QuantityName): Quantity {
  const e = computeExpectations(input);
  const q = e.quantities[name];
  if (!q) throw new Error(`${name} not computed; missing: ${JSON.stringify(e.missing)}`);
  return q;
}

/** A healthy 220 V shunt machine of our own, for property tests. */
export function shuntMachine(connection: ModelInput['machine']['connection'] = 'shunt'): ModelInput['machine'] {
  return {
    connection,
    nameplate: { armatureVoltage: 220, armatureCurrent: 40, speed: 1500, power: 7500, fieldVoltage: 220, fieldCurrent: 1.1 },
    resistances: { armature: 0.4, shuntField: 200, seriesField: 0.05 },
  };
}
