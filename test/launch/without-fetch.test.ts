import { describe, expect, it } from 'vitest';
import { withoutFetch } from '../../src/launch/without-fetch.js';

describe('withoutFetch', () => {
  it('hides the global fetch while loading and puts it back, also after a failure', async () => {
    const before = globalThis.fetch;
    expect(typeof before).toBe('function');
    expect(await withoutFetch(async () => typeof globalThis.fetch)).toBe('undefined');
    expect(globalThis.fetch).toBe(before);
    await expect(withoutFetch(() => Promise.reject(new Error('no')))).rejects.toThrow('no');
    expect(globalThis.fetch).toBe(before);
  });

  it('lets yoga-layout load its layout engine without fetch', async () => {
    const yoga = await withoutFetch(() => {
      // yoga-layout is first imported here, so it loads its WebAssembly with no fetch to use.
      expect(typeof globalThis.fetch).toBe('undefined');
      return import('yoga-layout');
    });
    const node = yoga.default.Node.create();
    node.setWidth(12);
    node.calculateLayout(undefined, undefined);
    expect(node.getComputedWidth()).toBe(12);
    node.free();
  });
});
