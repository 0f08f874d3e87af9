/**
 * Which way a DC motor turns after a change of connections. Torque follows flux × armature
 * current: reversing one of them reverses the machine, reversing both does not.
 */
import { CONNECTION_TRAITS, type Connection } from './machine.js';

export type Swap = 'supply' | 'armature' | 'shunt-field' | 'series-field' | 'both-fields';

export interface AfterSwap {
  reversed: boolean;
  /** For a compound machine: whether the series field still aids the shunt field. */
  cumulative?: boolean;
}

export function afterSwap(connection: Connection, swap: Swap): AfterSwap {
  const t = CONNECTION_TRAITS[connection];
  const hasField = t.shuntField || t.seriesField;
  const compound = t.shuntField && t.seriesField;
  // Sign of armature current and of each field's current after the swap.
  const armature = swap === 'supply' || swap === 'armature' ? -1 : 1;
  const fedFromSupply = swap === 'supply' ? -1 : 1;
  const shunt = t.shuntField ? (swap === 'shunt-field' || swap === 'both-fields' ? -1 : 1) * (t.fieldAcrossTerminals ? fedFromSupply : 1) : 1;
  // The series field sits in the line: it follows the supply, not a swap made at A1/A2.
  const series = t.seriesField ? fedFromSupply * (swap === 'series-field' || swap === 'both-fields' ? -1 : 1) : 1;
  const flux = !hasField ? 1 : t.shuntField ? shunt : series;
  const result: AfterSwap = { reversed: flux * armature < 0 };
  if (compound) result.cumulative = (shunt > 0) === (series > 0) ? t.seriesSense === 1 : t.seriesSense !== 1;
  return result;
}
