import { describe, expect, it } from 'vitest';
import { clockTime } from '../../src/report/clock-time.js';

// Offsets from the IANA time zone database as Node's ICU carries it: Berlin UTC+1 in winter and
// UTC+2 in summer, Kolkata UTC+5:30 all year, Chicago UTC−6 in winter.
describe('times in a report', () => {
  const t = '2026-12-01T21:05:00.000Z';

  it('are local with their offset, and UTC beside them', () => {
    expect(clockTime(t, 'Europe/Berlin')).toBe('2026-12-01 22:05 UTC+1 (21:05 UTC)');
    expect(clockTime('2026-07-01T21:05:00Z', 'Europe/Berlin')).toBe('2026-07-01 23:05 UTC+2 (21:05 UTC)');
    expect(clockTime(t, 'America/Chicago')).toBe('2026-12-01 15:05 UTC-6 (21:05 UTC)');
  });

  it('give the UTC date too when the local date is another', () => {
    expect(clockTime(t, 'Asia/Kolkata')).toBe('2026-12-02 02:35 UTC+5:30 (2026-12-01 21:05 UTC)');
  });

  it('are UTC alone where the zone is UTC, unknown or not given', () => {
    for (const zone of [undefined, 'UTC', 'Etc/UTC', 'Europe/London', 'Nowhere/Atall']) expect(clockTime(t, zone), String(zone)).toBe('2026-12-01 21:05 UTC');
  });

  it('leave text that is not a UTC time as it was written', () => {
    expect(clockTime('after the night shift', 'Europe/Berlin')).toBe('after the night shift');
    expect(clockTime('2026-12-01T21:05:00+01:00', 'Europe/Berlin')).toBe('2026-12-01T21:05:00+01:00');
  });
});
