/**
 * Starts the dialogue in the terminal: loaded lazily by the CLI, so JSON and file modes never
 * load Ink or React. The safety notice is on screen at once; the rule base, the question policy
 * and the engine are prepared right after, so the first frame does not wait for them.
 * Resolves to the exit code.
 */
import { useEffect, useState } from 'react';
import { Box, Text, render, useInput } from 'ink';
import { Dialogue, type DialogueProps } from './Dialogue.js';

/** Exit codes by signal, 128 + its number, as shells report them. */
const SIGNAL_CODES = { SIGINT: 130, SIGTERM: 143, SIGHUP: 129 } as const;

export type Prepared = { ok: true; props: Omit<DialogueProps, 'onInterrupt'> } | { ok: false; message: string };

interface BootProps {
  notice: string;
  color: boolean;
  prepare: () => Prepared;
  onFail: (message: string) => void;
  onInterrupt: () => void;
}

function Boot({ notice, color, prepare, onFail, onInterrupt }: BootProps) {
  const [props, setProps] = useState<Omit<DialogueProps, 'onInterrupt'> | undefined>();
  useInput((input, key) => {
    if (!props && key.ctrl && input === 'c') onInterrupt();
  });
  useEffect(() => {
    // After the first frame is out: building the policy takes a moment the fitter spends reading the notice.
    const timer = setTimeout(() => {
      const p = prepare();
      if (p.ok) setProps(p.props);
      else onFail(p.message);
    }, 0);
    return () => clearTimeout(timer);
  }, []);
  if (props) return <Dialogue {...props} onInterrupt={onInterrupt} />;
  return (
    <Box flexDirection="column">
      <Text {...(color ? { color: 'red' } : {})}>{notice}</Text>
      <Text>Press Enter to begin.</Text>
    </Box>
  );
}

export async function runDialogue(boot: { notice: string; color: boolean; prepare: () => Prepared }): Promise<{ code: number; message?: string }> {
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
      prepare={boot.prepare}
      onInterrupt={() => stop('SIGINT')}
      onFail={(m) => {
        code = 2;
        message = m;
        app.unmount();
      }}
    />,
    { exitOnCtrlC: false, patchConsole: false },
  );
  const onTerm = () => stop('SIGTERM');
  const onHup = () => stop('SIGHUP');
  process.once('SIGTERM', onTerm);
  process.once('SIGHUP', onHup);
  await app.waitUntilExit();
  process.off('SIGTERM', onTerm);
  process.off('SIGHUP', onHup);
  return message === undefined ? { code } : { code, message };
}
