/**
 * autocannon in a child process of its own (spawned, not spawnSync: the calling process may be
 * the one serving the requests meanwhile), its JSON report read back. autocannon reports p90
 * and p97.5, not p95.
 */
import { spawn } from 'node:child_process';
import { join } from 'node:path';
import { findRepoRoot } from '../src/config/load-config.js';

export interface Latency {
  p50: number;
  p90: number;
  p97_5: number;
  p99: number;
  max: number;
}

export interface LoadFigures {
  requests: number;
  /** Errors and timeouts */
  errors: number;
  non2xx: number;
  latency: Latency;
}

/** `connections` connections for `seconds` s against `url`, each request with `headers`. */
export async function autocannon(
  url: string,
  options: { connections: number; seconds: number; headers: Record<string, string> },
): Promise<LoadFigures> {
  const bin = join(findRepoRoot(), 'node_modules', '.bin', 'autocannon');
  const args = ['-c', String(options.connections), '-d', String(options.seconds), '-j'];
  for (const [name, value] of Object.entries(options.headers)) args.push('-H', `${name}=${value}`);
  const run = await new Promise<{ status: number | null; stdout: string; stderr: string }>(
    (resolve, reject) => {
      const child = spawn(bin, [...args, url]);
      let stdout = '';
      let stderr = '';
      child.stdout.on('data', (chunk: Buffer) => (stdout += chunk.toString()));
      child.stderr.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
      child.on('error', reject);
      child.on('close', (status) => resolve({ status, stdout, stderr }));
    },
  );
  if (run.status !== 0) throw new Error(`autocannon failed: ${run.stderr}`);
  const r = JSON.parse(run.stdout) as {
    requests: { total: number };
    errors: number;
    timeouts: number;
    non2xx: number;
    latency: Latency;
  };
  return {
    requests: r.requests.total,
    errors: r.errors + r.timeouts,
    non2xx: r.non2xx,
    latency: r.latency,
  };
}
