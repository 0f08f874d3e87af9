// The `clone` package as json-rules-engine uses it (a deep copy of each rule's conditions for
// every rule result), without its cost: `clone` finds repeated objects with a linear search of
// every object copied so far, which made it a fifth of a diagnosis. Plain objects (prototype
// kept) and arrays are copied here with a map of those already copied; anything else (a Map,
// a Date, a Buffer…) is handed, with what is inside it, to the package itself.
const original = require('../node_modules/clone/clone.js');

/**
 * What copying needs to know of a prototype, worked out once for each: whether its objects are
 * handed to the package (not plain, or a Map, a Set, a Date…), and which keys of its own it
 * shadows (as the package does: a key the prototype holds without a setter is not copied).
 * Prototypes are not changed while a rule runs, so what is learnt stays true.
 */
const prototypes = new WeakMap();
function prototypeOf(proto, value) {
  let known = prototypes.get(proto);
  if (known === undefined) {
    const plain = proto === Object.prototype || Object.getPrototypeOf(proto) === Object.prototype;
    const special = !plain || value instanceof Map || value instanceof Set || value instanceof Date || value instanceof RegExp || value instanceof Error || value instanceof Promise;
    const shadowed = new Set();
    for (const key of Object.getOwnPropertyNames(proto)) if (Object.getOwnPropertyDescriptor(proto, key).set == null) shadowed.add(key);
    known = { special, shadowed: shadowed.size > 0 ? shadowed : undefined };
    prototypes.set(proto, known);
  }
  return known;
}

/**
 * One value copied, with `copied` mapping each object already copied to its copy (shared objects
 * stay shared, a cycle stays a cycle). A plain array is copied by index, keeping its holes: the
 * lists json-rules-engine copies are JSON lists, with no other keys of their own.
 */
function copy(value, copied) {
  if (value === null || typeof value !== 'object') return value;
  const seen = copied.get(value);
  if (seen !== undefined) return seen;
  const proto = Object.getPrototypeOf(value);
  if (proto === Array.prototype) {
    const out = [];
    copied.set(value, out);
    for (let i = 0; i < value.length; i++) if (i in value) out[i] = copy(value[i], copied);
    return out;
  }
  if (Array.isArray(value)) return original(value);
  const known = proto === null ? undefined : prototypeOf(proto, value);
  if ((known && known.special) || ArrayBuffer.isView(value) || Object.getOwnPropertySymbols(value).length > 0) return original(value);
  const out = Object.create(proto);
  copied.set(value, out);
  const shadowed = known && known.shadowed;
  for (const key in value) {
    if (shadowed !== undefined && shadowed.has(key)) continue;
    out[key] = copy(value[key], copied);
  }
  return out;
}

function clone(parent) {
  return parent === null || typeof parent !== 'object' ? parent : copy(parent, new Map());
}

module.exports = clone;
module.exports.clonePrototype = original.clonePrototype;
