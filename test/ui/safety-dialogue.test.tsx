import { describe, expect, it } from 'vitest';
import { renderDialogue } from '../support/dialogue.js';

/** An invented job: a separately excited mixer drive; the opening answers up to the symptoms. */
async function openJob(d: ReturnType<typeof renderDialogue>, state: string, symptom: string, power = '30 kW') {
  await d.type(''); // past the safety notice
  await d.type(state);
  await d.type('1'); // no fault shown
  await d.type('separately');
  await d.type('converter');
  await d.type(''); // feedback unknown
  await d.type('blower');
  await d.type('400 V');
  await d.type('85 A');
  await d.type('1500 rpm');
  await d.type(power);
  await d.type('310 V');
  await d.type('2.4 A');
  await d.type('F');
  await d.type('WO-5150');
  await d.type('mixer 4');
  await d.type('T. Apprentice');
  await d.type(symptom);
}

describe('safety in the dialogue', () => {
  it('warns of a runaway as soon as the complaint is made, for an apprentice too, and asks nothing live after it', async () => {
    const d = renderDialogue({ work: { role: 'apprentice', apprenticesMayTestLive: true } });
    await openJob(d, 'running', '3'); // runs faster than it should
    const afterComplaint = d.screen();
    expect(afterComplaint).toContain('!! DANGER — the machine is, or was, running well above its safe speed');
    const asked: string[] = [];
    for (let k = 0; k < 14 && !(d.lastFrame() ?? '').includes('Type start N'); k++) {
      asked.push((d.lastFrame() ?? '').split('\n').find((l) => l.startsWith('? ')) ?? '');
      await d.type('');
    }
    expect(asked.filter((q) => /LIVE TEST/.test(q))).toEqual([]);
    d.unmount();
  });

  it('takes a bare nameplate output in the kW the question shows', async () => {
    const d = renderDialogue();
    await openJob(d, 'stopped', '4', '30');
    expect(d.screen()).toContain('Nameplate: rated output?  → 30 kW');
    d.unmount();
  });

  it('asks back a reading several times its plate value before it counts, and keeps the corrected one', async () => {
    const d = renderDialogue();
    await openJob(d, 'running', '4'); // runs slower than it should
    let found = false;
    for (let k = 0; k < 16; k++) {
      const asked = (d.lastFrame() ?? '').split('\n').find((l) => l.startsWith('? ')) ?? '';
      if (/armature voltage at the machine terminals/.test(asked)) {
        found = true;
        break;
      }
      await d.type('');
    }
    expect(found).toBe(true);
    await d.type('1900');
    expect(d.lastFrame()).toMatch(/armature voltage 1900 V is 4\.8 × the plate's 400 V.*Keep it\?/s);
    await d.type('no');
    expect(d.lastFrame()).toContain('not kept: type the reading again');
    await d.type('380');
    expect(d.screen()).toContain('armature voltage at the machine terminals?  → 380 V');
    expect(d.screen()).not.toContain('→ 1900 V');
    d.unmount();
  });
});

describe('the troubleshooting loop in the dialogue', () => {
  it('asks a check its result, its readings by name with units and a finding, then shows what changed and the next check', async () => {
    const d = renderDialogue();
    await openJob(d, 'stopped', '4 9'); // slow and cannot pull its load
    await d.type('done');
    const result = d.screen();
    expect(result).toContain('Checks, in order:');
    expect(result).toMatch(/Next: check 1, /);
    // Work whichever check the tool names first.
    const first = /Next: check 1, ([^[]+) \[/.exec(result)![1]!.trim();
    await d.type('start 1');
    for (let k = 0; k < 6 && /\? .*(Isolation points|Lock and tag|proved it dead|voltage tester)/.test(d.lastFrame() ?? ''); k++) await d.type('x');
    await d.type('done 1');
    expect(d.lastFrame()).toContain('Result?');
    expect(d.lastFrame()).toMatch(/1 normal.*2 abnormal.*3 inconclusive/s);
    await d.type('maybe');
    expect(d.lastFrame()).toContain('is not one of the choices');
    await d.type('normal');
    // Whatever the check measures is asked by name with its unit; Enter skips.
    for (let k = 0; k < 8 && !/What did you find/.test(d.lastFrame() ?? ''); k++) await d.type('');
    expect(d.lastFrame()).toContain('What did you find');
    await d.type('nothing out of the ordinary');
    const after = d.screen().replace(/\s+/g, ' ');
    expect(after).toContain(`After "${first}" (normal):`);
    expect(after).toMatch(/↓ falls: .* — .*: normal: nothing out of the ordinary — it shows this fault \d+ % of the time/);
    expect(after).toMatch(/Next: check 2, /);
    d.unmount();
  });

  it('takes a reading a check measures, in the unit the prompt shows, into the model', async () => {
    const d = renderDialogue();
    await openJob(d, 'stopped', '4 9');
    await d.type('done');
    const screen = d.screen();
    const n = screen.split('\n').find((l) => /^ *\d+\. Measure armature voltage and current under load/.test(l));
    if (!n) return d.unmount(); // the first list does not hold it for this job: nothing to try here
    const k = /^ *(\d+)\./.exec(n)![1]!;
    await d.type(`start ${k}`);
    await d.type(`done ${k}`);
    await d.type('abnormal');
    expect((d.lastFrame() ?? '').replace(/\s+/g, ' ')).toMatch(/machine's terminal voltage\? \(in V; Enter to skip\)/i);
    await d.type('330');
    for (let k = 0; k < 8 && !/What did you find/.test(d.lastFrame() ?? ''); k++) await d.type('');
    await d.type(''); // no finding in words
    expect(d.lastFrame()).toContain('Does this find the fault?');
    await d.type(''); // not yet
    expect(d.screen().replace(/\s+/g, ' ')).toMatch(/After "Measure armature voltage and current under load" \(abnormal\):/);
    d.unmount();
  });
});

describe('context before detail', () => {
  it('asks whether any work was done before which terminations were re-made', async () => {
    const d = renderDialogue();
    await openJob(d, 'running', '1'); // runs the wrong way: the terminations matter at once
    const asked = (d.lastFrame() ?? '').split('\n').find((l) => l.startsWith('? ')) ?? '';
    expect(asked).toContain('Has any work been done');
    await d.type('rewired');
    const next: string[] = [];
    for (let k = 0; k < 3; k++) {
      next.push((d.lastFrame() ?? '').split('\n').find((l) => l.startsWith('? ')) ?? '');
      await d.type('');
    }
    expect(next.some((q) => q.includes('Which terminations were disconnected and re-made'))).toBe(true);
    d.unmount();
  });
});
