/**
 * Starts the dialogue in the terminal: loaded lazily by the CLI, so JSON and file modes never
 * load Ink or React. Resolves to the exit code.
 */
import { render } from 'ink';
import { Dialogue, type DialogueProps } from './Dialogue.js';

export async function runDialogue(props: Omit<DialogueProps, 'onInterrupt'>): Promise<number> {
  let interrupted = false;
  const app = render(<Dialogue {...props} onInterrupt={() => { interrupted = true; app.unmount(); }} />, { exitOnCtrlC: false, patchConsole: false });
  await app.waitUntilExit();
  return interrupted ? 130 : 0;
}
