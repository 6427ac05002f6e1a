// Small console helpers shared by the start and test scripts.
const useColour = process.stdout.isTTY && !process.env.NO_COLOR;
const paint = (code, text) => (useColour ? `\x1b[${code}m${text}\x1b[0m` : text);

export const step = (text) => console.log(paint('36', '▸ ') + text);
export const info = (text) => console.log('  ' + text);
export const ok = (text) => console.log(paint('32', '✓ ') + text);
export const warn = (text) => console.warn(paint('33', '! ') + text);

/** An error that the scripts print as a plain message (no stack), then exit 1. */
export class StopError extends Error {}

export function fail(message) {
  throw new StopError(message);
}

/** Runs `main`, printing a StopError as a clear message and anything else with its stack. */
export async function runMain(main) {
  try {
    await main();
  } catch (error) {
    if (error instanceof StopError) {
      console.error(paint('31', '✗ ') + error.message);
    } else {
      console.error(error);
    }
    process.exitCode = 1;
    if (process.env.ROLLOFF_EXIT_ON_ERROR !== '0') process.exit(1);
  }
}
