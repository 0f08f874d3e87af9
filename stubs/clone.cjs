// The `clone` package as json-rules-engine uses it (a deep copy of each rule's conditions for
// every rule result), without its cost: `clone` finds repeated objects with a linear search of
// every object copied so far, which made it a fifth of a diagnosis. Plain objects (prototype
// kept) and arrays are copied here with a map of those already copied; anything else (a Map,
// a Date, a Buffer…) is handed, with what is inside it, to the package itself.
const original = require('../node_modules/clone/clone.js');

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
    const plain = proto === null || proto === Object.prototype || Object.getPrototypeOf(proto) === Object.prototype;
    if (!plain || value instanceof Map || value instanceof Set || value instanceof Date || value instanceof RegExp || value instanceof Error || value instanceof Promise || ArrayBuffer.isView(value) || Object.getOwnPropertySymbols(value).length > 0) return original(value);
    const out = Object.create(proto);
    copied.set(value, out);
    for (const key in value) {
      const own = proto === null ? undefined : Object.getOwnPropertyDescriptor(proto, key);
      // As the package does: an accessor of the prototype without a setter is not copied.
      if (own && own.set == null) continue;
      out[key] = copy(value[key]);
    }
    return out;
  };
  return copy(parent);
}

module.exports = clone;
module.exports.clonePrototype = original.clonePrototype;
