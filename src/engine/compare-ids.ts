/**
 * Orders ids and names by their code units. Ids are ASCII, and an order that ties results and
 * lists must not depend on the machine's locale, as localeCompare's does (whose first call also
 * loads the collation tables: about 14 ms of every run).
 */
export function compareIds(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}
