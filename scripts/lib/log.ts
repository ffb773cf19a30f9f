/** Console output of the orchestration scripts: one prefix, plain words. */
const useColour = process.stdout.isTTY && !process.env.NO_COLOR;
const paint = (code: string, text: string) =>
  useColour ? `\u001b[${code}m${text}\u001b[0m` : text;

export const log = {
  step: (message: string) => console.log(`${paint('36', 'cairn')} ${message}`),
  ok: (message: string) => console.log(`${paint('32', 'cairn')} ${message}`),
  warn: (message: string) => console.warn(`${paint('33', 'cairn')} ${message}`),
  error: (message: string) => console.error(`${paint('31', 'cairn')} ${message}`),
};

/** A failure the user can fix: printed without a stack trace, exit code 1. */
export class UserFacingError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UserFacingError';
  }
}

export function fail(message: string): never {
  throw new UserFacingError(message);
}

/** Runs main(), printing a UserFacingError as a plain message. */
export function runMain(main: () => Promise<void>): void {
  main().catch((error: unknown) => {
    if (error instanceof UserFacingError || (error as Error)?.name === 'ConfigError') {
      log.error((error as Error).message);
    } else {
      log.error((error as Error)?.stack ?? String(error));
    }
    process.exit(1);
  });
}
