/** The local mail capture's messages, as the browser tests read them (the fakes' mailbox API). */

/** Every message the capture holds now, newest last. */
export async function readMailbox<T>(fakesUrl: string): Promise<T[]> {
  return (await (await fetch(`${fakesUrl}/mailbox/api/messages`)).json()) as T[];
}

/** Polls the capture until `check` holds for its messages; throws after `timeoutMs`. */
export async function waitForMail<T>(
  fakesUrl: string,
  check: (messages: T[]) => boolean,
  what: string,
  timeoutMs = 60_000,
): Promise<T[]> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const messages = await readMailbox<T>(fakesUrl);
    if (check(messages)) return messages;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 250));
  }
}
