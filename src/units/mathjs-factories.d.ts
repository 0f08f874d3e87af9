// mathjs exports its factory functions, but its typings declare only the dependency maps made of
// them (and one map, subtractScalar's). These are the ones the unit adapter builds its own map from.
import type { FactoryFunction, FactoryFunctionMap } from 'mathjs';

declare module 'mathjs' {
  export const createUnitClass: FactoryFunction<unknown>;
  export const createUnitFunction: FactoryFunction<unknown>;
  export const createCreateUnit: FactoryFunction<unknown>;
  export const subtractScalarDependencies: FactoryFunctionMap;
}
