/**
 * The fitter's dialogue: the settled transcript in <Static>, a short live area with the leading
 * causes, the question, its choices, the input line and a footer of commands. All decisions are
 * the reducer's; this only renders state and runs the diagnosis when the answers change.
 */
import { useEffect, useMemo, useReducer, useRef, useState } from 'react';
import { Box, Static, Text, useApp, useStdout } from 'ink';
import type { RuleEngines } from '../engine/run-rules.js';
import { diagnose, isolationSteps } from '../engine/diagnose.js';
import { parseDraft } from '../dialogue/job.js';
import { COMMANDS, currentStep, draftOf, expectsFreeText, initialState, outcomeStep, progressOf, reduce, resultChecks, workPrompt, type DialogueContext, type DialogueState, type SavedProgress } from '../dialogue/reducer.js';
import { statusOf, type WorkEntry } from '../dialogue/work.js';
import type { DialogueQuestion } from '../dialogue/questions.js';
import type { CaseFile } from '../knowledge/case-schema.js';
import type { Answer } from '../dialogue/job.js';
import type { Diagnosis } from '../engine/diagnose.js';
import { formatDiagnosis, warningLine } from '../shell/format-diagnosis.js';
import { formatLoopUpdate, formatNext } from '../shell/format-loop.js';
import { wrapText } from '../shell/wrap.js';
import { whyAsked } from '../dialogue/why.js';
import { useLineInput } from './use-line-input.js';

export interface DialogueProps {
  ctx: DialogueContext;
  engine: RuleEngines;
  safetyNotice: string;
  initialAnswers?: Answer[];
  /** Checks already worked, from a resumed session. */
  initialWork?: WorkEntry[];
  /** From a resumed session: the prompts that were open when it was saved. */
  initialProgress?: SavedProgress;
  /** Called after every change of answers, checks worked, or answers at a check's or the outcome's prompts: the shell saves the session, and says why not if it could not. */
  onAnswers?: (answers: Answer[], work: WorkEntry[], progress: SavedProgress) => string | undefined | void;
  /** Saves the job, with the outcome recorded so far; returns the words to show (where it went, or why not). */
  onSave?: (answers: Answer[], outcome: Answer[], work: WorkEntry[]) => string;
  /** Files the job with its recorded outcome as a case; returns the words to show. */
  onRecord?: (answers: Answer[], outcome: Answer[], work: WorkEntry[]) => string;
  /** Writes the job report; resolves to the words to show. */
  onReport?: (state: DialogueState) => Promise<string>;
  onInterrupt?: () => void;
  color?: boolean;
  /** Draws the machine's characteristic for the result; none when absent or not drawable. */
  chart?: (job: CaseFile) => string | undefined;
}

interface Line {
  key: string;
  text: string;
  tone?: 'danger' | 'caution' | 'notice' | 'muted' | 'answer';
}

const now = () => new Date().toISOString();

export function Dialogue({ ctx, engine, safetyNotice, initialAnswers, initialWork, initialProgress, onAnswers, onSave, onRecord, onReport, onInterrupt, color = true, chart }: DialogueProps) {
  const { exit } = useApp();
  const { stdout } = useStdout();
  const width = Math.max(40, stdout?.columns ?? 80);
  const [state, dispatch] = useReducer((s: DialogueState, e: Parameters<typeof reduce>[1]) => reduce(s, e, ctx), undefined, () => initialState(initialAnswers, initialWork, initialProgress));
  const step = useMemo(() => currentStep(state, ctx), [state, ctx]);
  const typed = useLineInput(
    (line) => dispatch({ type: 'input', text: line, at: now() }),
    () => (onInterrupt ? onInterrupt() : exit(new Error('interrupted'))),
    true,
    useMemo(() => expectsFreeText(state, ctx), [state, ctx]),
  );

  // Save after every answer anywhere: the questions, a check's prompts, the outcome.
  const progress = progressOf(state);
  const snapshot = JSON.stringify([state.answers, state.work, progress]);
  const lastSaved = useRef(initialAnswers?.length ? '' : snapshot);
  const [saveProblem, setSaveProblem] = useState<string | undefined>();
  useEffect(() => {
    if (snapshot === lastSaved.current) return;
    lastSaved.current = snapshot;
    setSaveProblem(onAnswers?.(state.answers, state.work, progress) ?? undefined);
  }, [snapshot]);

  // Diagnose the answers as they now stand.
  useEffect(() => {
    const parsed = parseDraft(draftOf(state, ctx));
    if (!parsed.ok) return;
    let live = true;
    const version = state.version;
    void diagnose(parsed.job, ctx.flow.base, engine).then((d) => live && dispatch({ type: 'diagnosed', version, diagnosis: d }));
    return () => {
      live = false;
    };
  }, [state.version]);

  const diagnosis = state.diagnosis?.version === state.version ? state.diagnosis.value : undefined;
  // The shell writes what was asked for; its words come back as `saved`.
  useEffect(() => {
    const r = state.request;
    if (!r) return;
    const handler = r === 'save' ? onSave : r === 'record' ? onRecord : undefined;
    if (r === 'report') {
      if (onReport) void onReport(state).then((message) => dispatch({ type: 'saved', message }));
      else dispatch({ type: 'saved', message: 'reports are not available here' });
    } else dispatch({ type: 'saved', message: handler ? handler(state.answers, state.outcome, state.work) : `${r} is not available here` });
  }, [state.request]);
  const recording = state.phase === 'recording' ? outcomeStep(state, ctx) : undefined;
  const working = workPrompt(state, ctx);

  // Each severity has its own look; the words' prefixes (!!, ! CAUTION, NOTICE, ✗) carry it without colour.
  const tone = (t: Line['tone']): { color?: string; backgroundColor?: string; bold?: boolean } => {
    if (!color) return {};
    if (t === 'danger') return { color: 'whiteBright', backgroundColor: 'red', bold: true };
    if (t === 'caution') return { color: 'yellow', bold: true };
    if (t === 'notice') return { color: 'cyan' };
    const c = t === 'muted' ? 'gray' : t === 'answer' ? 'cyan' : undefined;
    return c ? { color: c } : {};
  };
  const prompt = (id: string) => ctx.flow.all.get(id)?.prompt ?? id;
  const transcript: Line[] = [
    { key: 'notice', text: `NOTICE: ${safetyNotice}`, tone: 'notice' },
    ...state.log.map((e, k): Line => {
      if (e.kind === 'answer') return { key: `l${k}`, text: `${prompt(e.answer.questionId)}  → ${e.answer.shown}`, tone: 'answer' };
      if (e.kind === 'withdrawn') return { key: `l${k}`, text: `↩ taken back: ${prompt(e.answer.questionId)} (was ${e.answer.shown})`, tone: 'muted' };
      if (e.kind === 'note') return { key: `l${k}`, text: e.text, tone: 'answer' };
      if (e.kind === 'warning') return { key: `l${k}`, text: warningLine(e.warning), tone: e.warning.severity };
      if (e.kind === 'panel') return { key: `l${k}`, text: panelText(e.which, e.question, ctx, e.diagnosis, safetyNotice, width), tone: 'muted' };
      if (e.kind === 'update') return { key: `l${k}`, text: formatLoopUpdate(e.previous, e.diagnosis, e.check), ...(e.diagnosis.found ? { tone: 'caution' as const } : {}) };
      const job = parseDraft(draftOf(state, ctx));
      return { key: `l${k}`, text: `${formatDiagnosis(e.diagnosis, { width, chart: job.ok && chart ? chart(job.job) : undefined })}\n\nQuestions ended: ${e.because}.\n\n${formatNext(e.diagnosis)}` };
    }),
  ];
  const leaders = diagnosis?.causes.slice(0, 3) ?? [];

  return (
    <Box flexDirection="column">
      <Static items={transcript}>{(l) => <Text key={l.key} {...tone(l.tone)}>{wrapText(l.text, width)}</Text>}</Static>
      {state.phase === 'notice' && <Text>Press Enter to begin.</Text>}
      {state.phase === 'asking' && leaders.length > 0 && (
        <Text>Leading: {leaders.map((c, k) => `${k + 1} ${c.title} ${c.score.toFixed(2)}`).join(' · ')}</Text>
      )}
      {state.confirming && <Text bold>? {state.confirming.says}. Keep it? (yes / no, or type the reading again)</Text>}
      {state.phase === 'asking' && !state.confirming && step.kind === 'ask' && <QuestionView question={step.question} firstIsolated={step.question.state === 'isolated' && !state.answers.some((a) => ctx.flow.all.get(a.questionId)?.state === 'isolated')} ctx={ctx} color={color} />}
      {recording && <QuestionView question={recording} firstIsolated={false} ctx={ctx} color={color} />}
      {working && <Text bold>? {state.pendingWork!.check.title}: {working.prompt}</Text>}
      {working?.options && (
        <Box flexWrap="wrap" columnGap={2}>
          {working.options.map((o, k) => <Text key={o.value}>{k + 1} {o.label}</Text>)}
        </Box>
      )}
      {state.phase === 'asking' && step.kind === 'needs-diagnosis' && <Text>Working out the next question…</Text>}
      {state.phase === 'finishing' && <Text>Working out the result…</Text>}
      {state.phase === 'result' && !working && (
        <Text>
          Checks: {resultChecks(state).map((c, k) => `${k + 1} ${c.result ?? (statusOf(state.work, c.id) === 'started' ? 'started' : '–')}`).join(' · ')}{'\n'}
          Type start N / done N as you work the checks (done asks the result), next for the next check, report for the job report, record to file the job with the cause you confirmed, save to keep it as it stands, back to change the last answer, or Ctrl-C to leave (the session is kept).
          {ctx.work?.role === 'lead' ? '\nAs lead: record files the job in the cases folder; then dctriage rules draft --from-case FILE proposes a rule from it, and dctriage review FILE --close NAME closes a saved job.' : ''}
        </Text>
      )}
      {state.saved && <Text>{state.saved}</Text>}
      {saveProblem && <Text {...(color ? { color: 'magenta' } : {})}>✗ {saveProblem}</Text>}
      {state.error && <Text {...(color ? { color: 'magenta' } : {})}>✗ {state.error}</Text>}
      {state.phase !== 'notice' && <Text>&gt; {typed}</Text>}
      <Text {...(color ? { color: 'gray' } : {})} >{width < 70 ? 'Enter=unknown · back why causes safety done help · Ctrl-C' : 'Enter alone = unknown · back · why · causes · safety · done · help · Ctrl-C'}</Text>
    </Box>
  );
}

function QuestionView({ question, firstIsolated, ctx, color }: { question: DialogueQuestion; firstIsolated: boolean; ctx: DialogueContext; color: boolean }) {
  const a = question.answer;
  return (
    <Box flexDirection="column">
      <Text bold>? {question.prompt}{question.state === 'live-test' ? '  [LIVE TEST: qualified person]' : question.state === 'isolated' ? '  [needs isolation]' : ''}{a.kind === 'quantity' ? `  (default unit ${a.unit ?? unitOf(a.dimension)})` : ''}</Text>
      {(a.kind === 'choice' || a.kind === 'many') && (
        <Box flexWrap="wrap" columnGap={2}>
          {a.options.map((o, k) => <Text key={o.value}>{k + 1} {o.label}</Text>)}
        </Box>
      )}
      {firstIsolated && (
        <Text {...(color ? { color: 'yellow' } : {})}>Isolate first: {ctx.flow.base.safety.isolation.steps.map((s, k) => `${k + 1}. ${s.says}`).join(' ')} Type safety for the DC-specific steps.</Text>
      )}
    </Box>
  );
}

function unitOf(d: string): string {
  return ({ voltage: 'V', signedVoltage: 'V', current: 'A', resistance: 'Ω', insulation: 'MΩ', power: 'W', speed: 'rpm', temperature: '°C', pressure: 'kPa', length: 'mm' } as Record<string, string>)[d] ?? '';
}

function panelText(which: string, question: DialogueQuestion | undefined, ctx: DialogueContext, diagnosis: Diagnosis | undefined, safetyNotice: string, width: number): string {
  if (which === 'safety') {
    const iso = ctx.flow.base.safety.isolation;
    const machine = diagnosis?.facts;
    const drive = typeof machine?.drive === 'string' ? machine.drive : 'unknown';
    const connection = typeof machine?.connection === 'string' ? machine.connection : 'unknown';
    return [safetyNotice, 'To isolate:', ...isolationSteps(iso, drive, connection).map((s, k) => `${k + 1}. ${s}`)].join('\n');
  }
  if (which === 'next') return diagnosis ? formatNext(diagnosis) : 'No result yet: type done to finish the questions first.';
  if (which === 'help') return [...Object.entries(COMMANDS).map(([w, says]) => `${w.padEnd(8)} ${says}`), 'Choices: their number or word. Quantities: as the meter reads, e.g. 14,5 V or 1450 rpm.'].join('\n');
  if (which === 'causes') return diagnosis ? formatDiagnosis({ ...diagnosis, checks: [] }, { readings: false, width }) : "No ranking yet: the machine's connection is needed first.";
  return question ? whyAsked(question, ctx.flow, diagnosis) : 'No question is waiting.';
}
