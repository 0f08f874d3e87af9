/**
 * How a command treats a failure to write its output, once per process: a reader that stops
 * early (dctriage … | head) is not an error; any other failure is one line and exit 74.
 */
let watching = false;

export function watchStdout(): void {
  if (watching) return;
  watching = true;
  process.stdout.on('error', (e: NodeJS.ErrnoException) => {
    if (e.code === 'EPIPE') process.exit(process.exitCode ?? 0);
    process.stderr.write(`dctriage: cannot write the output: ${e.message}\n`);
    process.exit(74);
  });
}
