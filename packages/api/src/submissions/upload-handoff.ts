/**
 * The bytes of an upload this process has just stored, kept in memory for a
 * short while so that, when this same process claims the job (the usual case:
 * intake kicks the local runner), it checks the file without reading it back
 * from extract_file_chunks. The stored chunks stay the source of truth: a job
 * claimed by another process, retried, or picked up after the entry was let
 * go reads the file from MariaDB as before.
 *
 * Bounded: at most HANDOFF_MAX_BYTES held in all (uploads still arriving
 * included), each entry for at most HANDOFF_MAX_AGE_MS (a timer lets it go).
 * An upload that does not fit is simply not kept.
 */
/** Total bytes held (about two extracts at the default 25 MB limit). */
export const HANDOFF_MAX_BYTES = 64 << 20;
/** How long an entry waits for its job to be claimed here. */
export const HANDOFF_MAX_AGE_MS = 60_000;

interface Entry {
  parts: Buffer[];
  bytes: number;
  timer: NodeJS.Timeout;
}

/** Collects one upload's stored parts, holding room for them as they come. */
export interface HandoffCollector {
  /** Adds the next stored part; past the room left, the collector stops keeping. */
  add(part: Buffer): void;
  /** Hands the parts over as submission `id`'s bytes. */
  commit(id: number): void;
  /** Gives back the room of parts not committed (always called at the end of the upload). */
  close(): void;
}

/** Provided with useFactory in SubmissionsModule (its options are not injected). */
export class UploadHandoff {
  private readonly entries = new Map<number, Entry>();
  /** Bytes of the entries and of uploads still arriving */
  private held = 0;

  constructor(
    private readonly maxBytes = HANDOFF_MAX_BYTES,
    private readonly maxAgeMs = HANDOFF_MAX_AGE_MS,
  ) {}

  /** Bytes held now, arriving uploads included (for tests and diagnostics). */
  get heldBytes(): number {
    return this.held;
  }

  /**
   * A collector for an upload being stored; room is held for its parts as they arrive.
   * `enabled` false (a process that runs no jobs) keeps nothing.
   */
  collector(enabled = true): HandoffCollector {
    let parts: Buffer[] | null = enabled ? [] : null;
    let bytes = 0;
    const giveBack = () => {
      this.held -= bytes;
      bytes = 0;
      parts = null;
    };
    return {
      add: (part) => {
        if (parts === null) return;
        if (this.held + part.length > this.maxBytes) return giveBack();
        this.held += part.length;
        bytes += part.length;
        parts.push(part);
      },
      commit: (id) => {
        if (parts === null || bytes === 0) return giveBack();
        this.drop(id);
        const timer = setTimeout(() => this.drop(id), this.maxAgeMs);
        timer.unref();
        this.entries.set(id, { parts, bytes, timer });
        // The room now belongs to the entry.
        parts = null;
        bytes = 0;
      },
      close: () => giveBack(),
    };
  }

  /** The bytes of submission `id` if this process still holds them; they are let go. */
  take(id: number): Buffer | null {
    const entry = this.entries.get(id);
    if (!entry) return null;
    this.drop(id);
    return entry.parts.length === 1 ? entry.parts[0]! : Buffer.concat(entry.parts, entry.bytes);
  }

  /** Lets go of submission `id`'s bytes. */
  private drop(id: number): void {
    const entry = this.entries.get(id);
    if (!entry) return;
    clearTimeout(entry.timer);
    this.entries.delete(id);
    this.held -= entry.bytes;
  }
}
