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
    known = { special, shadowed };
    prototypes.set(proto, known);
  }
  return known;
}

function clone(parent) {
  const copied = new Map();
  const copy = (value) => {
    if (value === null || typeof value !== 'object') return value;
    const seen = copied.get(value);
    if (seen !== undefined) return seen;
    if (Array.isArray(value)) {
      if (Object.getPrototypeOf(value) !== Array.prototype) return original(value);
      const out = [];
      copied.set(value, out);
      for (const key in value) out[key] = copy(value[key]);
      return out;
    }
    const proto = Object.getPrototypeOf(value);
    const known = proto === null ? undefined : prototypeOf(proto, value);
    if ((known && known.special) || ArrayBuffer.isView(value) || Object.getOwnPropertySymbols(value).length > 0) return original(value);
    const out = Object.create(proto);
    copied.set(value, out);
    for (const key in value) {
      if (known && known.shadowed.has(key)) continue;
      out[key] = copy(value[key]);
    }
    return out;
  };
  return copy(parent);
}

module.exports = clone;
module.exports.clonePrototype = original.clonePrototype;
