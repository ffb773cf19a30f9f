/**
 * The one owner of `benchmark_upkeep` (migration 0303): the lease of an upkeep job (pruning), so
 * that of several API processes one at a time runs it (database/job-leases.ts).
 */
import { Inject, Injectable } from '@nestjs/common';
import { Sequelize } from 'sequelize-typescript';
import { JobLeases } from '../../database/job-leases.js';

@Injectable()
export class BenchmarkUpkeepRepository {
  private readonly leases: JobLeases;

  constructor(@Inject(Sequelize) sequelize: Sequelize) {
    this.leases = new JobLeases(sequelize, 'benchmark_upkeep');
  }

  /** True when `owner` now holds the lease of `job` (no other process holds a live one). */
  claim(job: string, owner: string, leaseSeconds: number): Promise<boolean> {
    return this.leases.claim(job, owner, leaseSeconds);
  }

  /** Gives the lease back, with the outcome in words. */
  release(job: string, owner: string, outcome: string): Promise<void> {
    return this.leases.release(job, owner, outcome);
  }
}
