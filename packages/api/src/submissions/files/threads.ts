/** Starting the threads that read workbooks (sheet-scan-thread.ts, sheet-read-thread.ts). */
import { Worker } from 'node:worker_threads';

/**
 * A thread running the module `name` beside the module at `here` (its import.meta.url). Built
 * (dist/): the compiled sibling. From the sources (the tests): the .ts file through tsx,
 * registered in the new thread before it loads the file. The thread never keeps the process
 * alive.
 */
export function startWorker(here: string, name: string): Worker {
  const worker = here.endsWith('.js')
    ? new Worker(new URL(`./${name}.js`, here))
    : new Worker(
        `import('tsx/esm/api').then(({ register }) => { register(); return import(${JSON.stringify(new URL(`./${name}.ts`, here).href)}); })`,
        { eval: true },
      );
  worker.unref();
  return worker;
}

/** Threads of one kind kept for the next workbook: a few at most, each ended after a while unused. */
export class ThreadPool {
  private readonly idle: { worker: Worker; timer: NodeJS.Timeout }[] = [];

  constructor(
    private readonly here: string,
    private readonly name: string,
    private readonly maxIdle = 2,
    private readonly idleMs = 60_000,
  ) {}

  take(): Worker {
    const kept = this.idle.pop();
    if (kept) {
      clearTimeout(kept.timer);
      return kept.worker;
    }
    return startWorker(this.here, this.name);
  }

  /** Keeps a thread that finished its work cleanly for the next one. */
  park(worker: Worker): void {
    if (this.idle.length >= this.maxIdle) {
      void worker.terminate();
      return;
    }
    const timer = setTimeout(() => {
      const at = this.idle.findIndex((i) => i.worker === worker);
      if (at >= 0) this.idle.splice(at, 1);
      void worker.terminate();
    }, this.idleMs);
    timer.unref();
    this.idle.push({ worker, timer });
  }
}
