/**
 * Starts the dialogue in the terminal: loaded lazily by the CLI, so JSON and file modes never
 * load Ink or React. Resolves to the exit code.
 */
import { render } from 'ink';
import { Dialogue, type DialogueProps } from './Dialogue.js';

/** Exit codes by signal, 128 + its number, as shells report them. */
const SIGNAL_CODES = { SIGINT: 130, SIGTERM: 143, SIGHUP: 129 } as const;

export async function runDialogue(props: Omit<DialogueProps, 'onInterrupt'>): Promise<number> {
  let code = 0;
  // The session is written after every answer, so stopping here loses nothing; unmounting gives the terminal back.
  const stop = (signal: keyof typeof SIGNAL_CODES) => {
    code = SIGNAL_CODES[signal];
    app.unmount();
  };
  const app = render(<Dialogue {...props} onInterrupt={() => stop('SIGINT')} />, { exitOnCtrlC: false, patchConsole: false });
  const onTerm = () => stop('SIGTERM');
  const onHup = () => stop('SIGHUP');
  process.once('SIGTERM', onTerm);
  process.once('SIGHUP', onHup);
  await app.waitUntilExit();
  process.off('SIGTERM', onTerm);
  process.off('SIGHUP', onHup);
  return code;
}
