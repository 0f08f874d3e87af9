/**
 * A recorded time as people read it on paper: the local time where the job was done, with its
 * offset, and UTC beside it so reports from two sites still line up.
 * "2026-12-01T21:05:00Z" in Europe/Berlin → "2026-12-01 22:05 UTC+1 (21:05 UTC)".
 */
const ISO_UTC = /^(\d{4}-\d{2}-\d{2})T(\d{2}:\d{2})(:\d{2}(\.\d+)?)?Z$/;

export function clockTime(iso: string, timeZone?: string): string {
  const m = ISO_UTC.exec(iso);
  if (!m) return iso;
  const utc = `${m[1]} ${m[2]} UTC`;
  if (!timeZone || timeZone === 'UTC' || timeZone === 'Etc/UTC') return utc;
  let parts: Intl.DateTimeFormatPart[];
  try {
    parts = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', hourCycle: 'h23', timeZoneName: 'shortOffset' }).formatToParts(new Date(iso));
  } catch {
    return utc; // a zone this Node does not know
  }
  const part = (type: Intl.DateTimeFormatPartTypes) => parts.find((p) => p.type === type)?.value ?? '';
  const offset = part('timeZoneName').replace(/^GMT/, 'UTC');
  if (/^UTC([+-]0(:00)?)?$/.test(offset)) return utc;
  const localDate = `${part('year')}-${part('month')}-${part('day')}`;
  return `${localDate} ${part('hour')}:${part('minute')} ${offset} (${localDate === m[1] ? m[2] : `${m[1]} ${m[2]}`} UTC)`;
}

/**
 * The calendar date where the person is (TZ, else the system's zone), as YYYY-MM-DD: what a file
 * filed in the evening is named by, not the UTC date, which in a western zone is already tomorrow.
 * "2026-12-01T03:30:00Z" in America/Chicago → "2026-11-30".
 */
export function localDate(at: Date = new Date(), timeZone?: string): string {
  try {
    return new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(at);
  } catch {
    return at.toISOString().slice(0, 10); // a zone this Node does not know
  }
}
