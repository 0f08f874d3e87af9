import { describe, expect, it } from 'vitest';
import { renderDialogue } from '../support/dialogue.js';

/** An invented job: a shunt-wound winder running fast with its field rheostat burnt. */
async function openJob(d: ReturnType<typeof renderDialogue>) {
  await d.type(''); // past the safety notice
  await d.type('running');
  await d.type('1'); // no fault shown
  await d.type('shunt');
  await d.type('fixed');
  await d.type('shaft fan');
  await d.type('220 V');
  await d.type('24 A');
  await d.type('1500 rpm');
  await d.type('4,5 kW');
  await d.type('220 V');
  await d.type('0.8 A');
  await d.type('F');
  await d.type('WO-9001');
  await d.type('winder 2');
  await d.type('A. Fitter');
  await d.type('3'); // runs faster than it should
}

describe('the dialogue', () => {
  it('shows the safety notice before the first question', async () => {
    const d = renderDialogue();
    const first = d.lastFrame() ?? '';
    expect(first).toContain('Isolate, lock off and prove dead');
    expect(first).not.toContain('What is the machine doing now?');
    await d.type('');
    expect(d.lastFrame()).toContain('What is the machine doing now?');
    d.unmount();
  });

  it('takes a whole job through to ranked causes and ordered checks', async () => {
    const d = renderDialogue();
    await openJob(d);
    expect(d.lastFrame()).toMatch(/Leading: 1 /);
    // Answer whatever the policy asks with what this job would show.
    const answersFor: Record<string, string> = {
      'armature voltage': '221 V', 'armature current?': '9.5 A', 'field current?': '0.42 A', 'field voltage': '221 V',
      'Speed (hand tachometer)': '2010 rpm', 'terminations': 'none', 'recent': 'none', 'load is on': 'light', 'coupled': 'yes',
    };
    for (let k = 0; k < 16 && !(d.lastFrame() ?? '').includes('Type save'); k++) {
      const asked = (d.lastFrame() ?? '').split('\n').find((l) => l.startsWith('? ')) ?? '';
      const key = Object.keys(answersFor).find((q) => asked.includes(q));
      await d.type(key ? answersFor[key]! : '');
    }
    const all = d.screen();
    expect(all).toContain('Likely causes:');
    // Running far above its healthy speed raises the runaway warning: from then on nothing live is asked,
    // so the field current is left to the checks, and the leading cause is a field fault.
    expect(all).toMatch(/1\. Field (weak|circuit open)/);
    expect(all).toContain('DANGER — the machine is, or was, running well above its safe speed');
    expect(all).toContain('Checks, in order:');
    expect(all).toContain('Readings against a healthy machine');
    d.unmount();
  });

  it('asks a wrong-unit answer again with its reason, keeping earlier answers', async () => {
    const d = renderDialogue();
    await d.type('');
    await d.type('running');
    await d.type('1');
    await d.type('shunt');
    await d.type('fixed');
    await d.type('shaft fan');
    await d.type('5 A'); // rated armature voltage given in amperes
    const frame = d.lastFrame() ?? '';
    expect(frame).toContain('✗ "5 A" is not a voltage (expected a value in V)');
    expect(frame).toContain('? Nameplate: rated armature voltage?');
    expect(d.saved.at(-1)?.length).toBe(5);
    d.unmount();
  });

  it('goes back, and a changed answer changes the ranking', async () => {
    const d = renderDialogue();
    await openJob(d);
    const before = d.lastFrame() ?? '';
    await d.type('back'); // take back the symptoms
    expect(d.lastFrame()).toContain('What is it doing wrong?');
    await d.type('12'); // trips on earth fault instead of overspeed
    const after = d.lastFrame() ?? '';
    expect(before).not.toContain('Winding insulation failed to frame');
    expect(after).toContain('Winding insulation failed to frame');
    d.unmount();
  });

  it('after an earth-fault trip suggests nothing energised before the insulation test', async () => {
    const d = renderDialogue();
    await d.type('');
    await d.type('tripped');
    await d.type('earth-fault');
    await d.type('shunt');
    for (let k = 0; k < 11; k++) await d.type('');
    await d.type('12');
    expect(d.lastFrame()).toContain('DANGER — earth fault');
    // Nothing that means running it again: no live test and no running observation is asked.
    for (let k = 0; k < 14 && !(d.lastFrame() ?? '').includes('Type save'); k++) {
      expect(d.lastFrame()).not.toMatch(/\? Live test|\? Speed \(hand|\? How does the sparking/);
      await d.type('');
    }
    await d.type('done');
    const all = d.screen();
    const checks = all.slice(all.lastIndexOf('Checks, in order:'));
    const insulation = checks.indexOf('Insulation resistance and polarization index');
    expect(insulation).toBeGreaterThan(0);
    expect(checks.slice(0, insulation)).not.toMatch(/LIVE TEST|observe \(running/);
    expect(checks.indexOf('Before the next check, isolate')).toBeLessThan(insulation);
    d.unmount();
  });

  it('records the confirmed cause, the fix and the readings after the repair', async () => {
    const d = renderDialogue();
    await openJob(d);
    await d.type('done');
    await d.type('record');
    expect(d.lastFrame()).toContain('? Which cause did you confirm?');
    await d.type('another');
    await d.type('field-weak');
    await d.type('Replaced the field rheostat');
    await d.type('Rheostat wiper burnt');
    await d.type('A.P.');
    expect(d.lastFrame()).toContain('Recorded the job as test-case.json');
    const { outcomeOf } = await import('../../src/dialogue/outcome.js');
    expect(outcomeOf(d.recorded[0]!.outcome, '2026-12-01')).toEqual({ date: '2026-12-01', cause: 'field-weak', fix: 'Replaced the field rheostat', notes: 'Rheostat wiper burnt', recordedBy: 'A.P.' });
    d.unmount();
  });

  it('as an apprentice, needs a supervisor to start a check beyond looking and to sign it off', async () => {
    const d = renderDialogue({ work: { role: 'apprentice', apprenticesMayTestLive: false } });
    await openJob(d);
    await d.type('done');
    const screen = d.screen();
    const checks = screen.slice(screen.lastIndexOf('Checks, in order:')).split('\n').filter((l) => /^ ?\d+\. /.test(l));
    const n = (state: RegExp) => checks.findIndex((l) => state.test(l)) + 1;
    const live = n(/LIVE TEST/);
    const isolated = n(/\[isolated/);
    if (live > 0) {
      await d.type(`start ${live}`);
      expect(d.lastFrame()).toContain('the site does not allow apprentices to do live tests');
    }
    expect(isolated).toBeGreaterThan(0);
    await d.type(`done ${isolated}`);
    expect(d.lastFrame()).toContain(`check ${isolated} has not been started`);
    await d.type(`start ${isolated}`);
    expect(d.lastFrame()).toContain('Supervisor authorising this check');
    await d.type(''); // refusing an empty name
    expect(d.lastFrame()).toContain('a supervisor must be named');
    await d.type('R. Lead');
    await d.type('present');
    await d.type('Isolator Q3');
    await d.type('L-12');
    await d.type('R. Lead');
    await d.type('two-pole tester T-7');
    const flat = () => d.screen().replace(/\s+/g, ' ');
    expect(flat()).toMatch(/Started: .+ — A\. Fitter, \d\d:\d\d, authorised by R\. Lead \(present\)/);
    await d.type(`done ${isolated}`);
    await d.type('normal'); // the result comes first, then what the check measured (each may be skipped), then the finding
    for (let k = 0; k < 12 && !(d.lastFrame() ?? '').includes('What did you find'); k++) await d.type('');
    await d.type('found the rheostat track burnt');
    expect(d.lastFrame()).toContain('Supervisor signing it off');
    await d.type('R. Lead');
    expect(flat()).toMatch(/Done: .+ — A\. Fitter, \d\d:\d\d, signed off by R\. Lead; found: found the rheostat track burnt/);
    d.unmount();
  });

  it('resumes an interrupted session with every answer', async () => {
    const first = renderDialogue();
    await openJob(first);
    const answers = first.saved.at(-1)!;
    first.unmount();
    expect(answers.length).toBe(16);
    const again = renderDialogue({ initialAnswers: answers });
    await again.type('causes');
    const screen = again.screen();
    expect(screen).toContain('Asset or machine tag?  → winder 2');
    expect(screen).toContain('runs faster than it should');
    expect(again.lastFrame()).toMatch(/Likely causes:/);
    again.unmount();
  });
});
