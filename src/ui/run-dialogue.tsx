/**
 * Starts the dialogue in the terminal: loaded lazily by the CLI, so JSON and file modes never
 * load Ink or React. The safety notice is on screen at once; the rule base, the question policy
 * and the engine are prepared right after, so the first frame does not wait for them.
 * Resolves to the exit code.
 */
import { useEffect, useState } from 'react';
import { Box, Text, render, useInput } from 'ink';
import { Dialogue, type DialogueProps } from './Dialogue.js';
import { useLineInput } from './use-line-input.js';
import { guardedStdin } from './guarded-stdin.js';

/** Exit codes by signal, 128 + its number, as shells report them. */
const SIGNAL_CODES = { SIGINT: 130, SIGTERM: 143, SIGHUP: 129 } as const;

export type Prepared = { ok: true; props: Omit<DialogueProps, 'onInterrupt'>; note?: string } | { ok: false; message: string };

/** A kept session found at start: go on with it, or start a new job. */
export type SessionChoice = 'resume' | 'new';

interface BootProps {
  notice: string;
  color: boolean;
  /** Asked before anything else when a session with answers exists. */
  ask?: string | undefined;
  prepare: (choice?: SessionChoice) => Prepared;
  onFail: (message: string) => void;
  onInterrupt: () => void;
}

function Boot({ notice, color, ask, prepare, onFail, onInterrupt }: BootProps) {
  const [props, setProps] = useState<Omit<DialogueProps, 'onInterrupt'> | undefined>();
  const [note, setNote] = useState<string | undefined>();
  const [choice, setChoice] = useState<SessionChoice | undefined>(ask ? undefined : 'new');
  const [refused, setRefused] = useState<string | undefined>();
  useInput((input, key) => {
    // While asking, the line editor takes Ctrl-C itself.
    if (!props && !(ask && !choice) && key.ctrl && input === 'c') onInterrupt();
  });
  const typed = useLineInput(
    (line) => {
      const word = line.trim().toLowerCase();
      if (word === 'resume' || word === 'r') setChoice('resume');
      else if (word === 'new' || word === 'n') setChoice('new');
      else setRefused('type resume or new');
    },
    onInterrupt,
    ask !== undefined && choice === undefined,
  );
  useEffect(() => {
    if (!choice) return;
    // After the first frame is out: building the policy takes a moment the fitter spends reading the notice.
    const timer = setTimeout(() => {
      const p = prepare(ask ? choice : undefined);
      if (p.ok) {
        setNote(p.note);
        setProps(p.props);
      } else onFail(p.message);
    }, 0);
    return () => clearTimeout(timer);
  }, [choice]);
  if (props) {
    return (
      <Box flexDirection="column">
        {note && <Text>{note}</Text>}
        <Dialogue {...props} onInterrupt={onInterrupt} />
      </Box>
    );
  }
  return (
    <Box flexDirection="column">
      <Text {...(color ? { color: 'red' } : {})}>{notice}</Text>
      {ask && !choice ? (
        <>
          <Text>{ask}</Text>
          {refused && <Text {...(color ? { color: 'red' } : {})}>✗ {refused}</Text>}
          <Text>&gt; {typed}</Text>
        </>
      ) : (
        <Text>Press Enter to begin.</Text>
      )}
    </Box>
  );
}

export async function runDialogue(boot: { notice: string; color: boolean; ask?: string; prepare: (choice?: SessionChoice) => Prepared }): Promise<{ code: number; message?: string }> {
  let code = 0;
  let message: string | undefined;
  // The session is written after every answer, so stopping here loses nothing; unmounting gives the terminal back.
  const stop = (signal: keyof typeof SIGNAL_CODES) => {
    code = SIGNAL_CODES[signal];
    app.unmount();
  };
  const app = render(
    <Boot
      notice={boot.notice}
      color={boot.color}
      ask={boot.ask}
      prepare={boot.prepare}
      onInterrupt={() => stop('SIGINT')}
      onFail={(m) => {
        code = 2;
        message = m;
        app.unmount();
      }}
    />,
    { exitOnCtrlC: false, patchConsole: false, stdin: guardedStdin(process.stdin) },
  );
  // Bracketed paste: the terminal marks a paste, so its line breaks stay in a free-text answer.
  process.stdout.write('\u001b[?2004h');
  const onTerm = () => stop('SIGTERM');
  const onHup = () => stop('SIGHUP');
  process.once('SIGTERM', onTerm);
  process.once('SIGHUP', onHup);
  await app.waitUntilExit();
  process.stdout.write('\u001b[?2004l');
  process.off('SIGTERM', onTerm);
  process.off('SIGHUP', onHup);
  return message === undefined ? { code } : { code, message };
}
