/**
 * The insulation test judged by IEEE 43-2013: the 1-minute reading corrected to 40 °C for the
 * winding's insulation system, the recommended minimum for the winding tested, and the
 * polarization index where it means something.
 */
import { insulationAt40C, insulationMinimum, PI_NOT_MEANINGFUL_ABOVE_MOHM, polarizationIndexMinimum } from '../insulation.js';
import { addQuantity, assume, needs, type ModelContext } from './context.js';

export function insulationJudgement(ctx: ModelContext): void {
  const { readings, machine } = ctx;
  const ir1 = readings.insulationResistance1min;
  if (ir1 === undefined) return;
  const np = machine.nameplate ?? {};
  const cls = np.insulationClass;
  const testC = readings.insulationTestTemperature ?? readings.ambientTemperature;
  if (needs(ctx, 'insulationResistanceAt40C', { 'readings.insulationTestTemperature': testC })) {
    if (readings.insulationTestTemperature === undefined) assume(ctx, 'insulation test temperature taken as the ambient temperature');
    const system = machine.insulationSystem ?? 'thermosetting';
    if (machine.insulationSystem === undefined) assume(ctx, 'insulation system not given: taken as thermosetting (epoxy or polyester, most windings since the 1970s) for the IEEE 43 temperature correction');
    const formula = system === 'thermoplastic' ? 'R40 = Rt·0.5^((40 − T)/10) (IEEE 43, thermoplastic)' : 'R40 = Rt·exp(−B·(1/(T + 273) − 1/313)) (IEEE 43-2013, thermosetting)';
    addQuantity(ctx, 'insulationResistanceAt40C', { value: insulationAt40C(ir1, testC!, system), unit: 'Mohm', formula });
  }
  const winding = readings.insulationTestedWinding ?? 'whole-machine';
  if (readings.insulationTestedWinding === undefined) assume(ctx, 'insulation test taken as made on the whole machine (strictest winding minimum)');
  const armatureV = np.armatureVoltage ?? 1000;
  const fieldV = np.fieldVoltage ?? np.armatureVoltage ?? 1000;
  if (np.armatureVoltage === undefined) assume(ctx, 'rated voltage unknown: insulation minimum taken for a 1 kV winding');
  addQuantity(ctx, 'insulationMinimum', { value: insulationMinimum(winding, { armature: armatureV, field: fieldV }), unit: 'Mohm', formula: `IEEE 43-2013 recommended minimum at 40 °C, ${winding}` });
  const ir10 = readings.insulationResistance10min;
  if (!needs(ctx, 'polarizationIndex', { 'readings.insulationResistance10min': ir10 })) return;
  if (ir1 > PI_NOT_MEANINGFUL_ABOVE_MOHM) assume(ctx, `polarization index not judged: IR at 1 min is above ${PI_NOT_MEANINGFUL_ABOVE_MOHM} MΩ (IEEE 43)`);
  else if (ir1 > 0) {
    addQuantity(ctx, 'polarizationIndex', { value: ir10! / ir1, unit: '1', formula: 'PI = IR10min/IR1min' });
    addQuantity(ctx, 'polarizationIndexMinimum', { value: polarizationIndexMinimum(cls ?? 'B'), unit: '1', formula: `IEEE 43-2013 minimum, class ${cls ?? 'B (class unknown)'}` });
  }
}
