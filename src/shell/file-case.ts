/**
 * Files a validated case into a cases folder as YYYY-MM-DD-<id>.json. A valid case is never
 * refused: when the name or the id is taken, both get the next suffix (-2, -3, …).
 */
import { readdirSync } from 'node:fs';
import { caseSchema, SAFE_ID, type CaseFile } from '../knowledge/case-schema.js';
import { stableJson } from '../knowledge/canonical.js';
import { readJson } from '../knowledge/read-json.js';
import { failed, ok, type Result } from '../knowledge/result.js';
import { join } from 'node:path';
import { writeNewFile, writeProblem, type WriteOptions } from './safe-write.js';
import { Locked, waitForLock, type Lock } from './lock.js';
import { idFromTitle } from './id-from-title.js';

/** Held in a cases folder while a case is filed; not a case (not *.json). */
export const FILING_LOCK = '.dctriage-filing.lock';

export interface Filed {
  file: string;
  id: string;
  /** The id the case asked for, when a collision changed it. */
  requestedId?: string;
}


export function idsIn(dir: string): Set<string> {
  const ids = new Set<string>();
  for (const f of readdirSync(dir).filter((n) => n.endsWith('.json'))) {
    const r = readJson(`${dir}/${f}`);
    if (r.ok && r.value && typeof r.value === 'object' && typeof (r.value as { id?: unknown }).id === 'string') ids.add((r.value as { id: string }).id);
  }
  return ids;
}

/** `raw` is the case as written (quantities as typed); `parsed` says it is valid. */
export function fileCase(raw: Record<string, unknown>, parsed: CaseFile, dir: string, today: string, opts: WriteOptions = {}): Result<Filed> {
  const wanted = parsed.id ?? (idFromTitle(parsed.job?.asset ?? '') || 'job');
  if (!SAFE_ID.test(wanted)) return failed({ code: 'invalid', file: dir, path: 'id', message: `"${wanted}" is not a safe id` });
  const date = parsed.outcome?.date ?? today;
  // One filer at a time per folder: choosing a free id and writing its file is one step.
  let lock: Lock;
  try {
    lock = waitForLock(join(dir, FILING_LOCK));
  } catch (e) {
    const why = e instanceof Locked ? `another dctriage (process ${e.pid}) has been filing into this folder for a long time; try again` : writeProblem(e);
    return failed({ code: 'unwritable', file: dir, path: '', message: `could not write the case: ${why}` });
  }
  try {
    let taken: Set<string>;
    try {
      taken = idsIn(dir);
    } catch (e) {
      return failed({ code: 'unreadable', file: dir, path: '', message: `cases folder cannot be read (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})` });
    }
    const idFor = (n: number) => (n === 1 ? wanted : `${wanted}-${n}`);
    try {
      const w = writeNewFile(dir, `${date}-${wanted}`, '.json', (n) => stableJson({ ...raw, id: idFor(n) }, caseSchema), { ...opts, skip: (n) => taken.has(idFor(n)) });
      const id = idFor(w.suffix);
      return ok({ file: w.file, id, ...(id !== wanted ? { requestedId: wanted } : {}) });
    } catch (e) {
      return failed({ code: 'unwritable', file: dir, path: '', message: `could not write the case: ${writeProblem(e)}` });
    }
  } finally {
    lock.release();
  }
}
