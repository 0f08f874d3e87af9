/**
 * Runs `load` with the global fetch hidden. Ink's layout engine (yoga-layout) decodes its inline
 * WebAssembly with fetch when there is one, which makes Node load its whole HTTP client (about
 * 40 ms of the dialogue's first frame), and decodes the same bytes itself when there is none.
 * Nothing in dctriage uses fetch; it is put back as it was when `load` settles.
 */
export async function withoutFetch<T>(load: () => Promise<T>): Promise<T> {
  const original = Object.getOwnPropertyDescriptor(globalThis, 'fetch');
  Object.defineProperty(globalThis, 'fetch', { value: undefined, configurable: true, writable: true });
  try {
    return await load();
  } finally {
    if (original) Object.defineProperty(globalThis, 'fetch', original);
    else Reflect.deleteProperty(globalThis, 'fetch');
  }
}
