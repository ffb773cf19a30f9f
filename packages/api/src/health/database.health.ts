import { Injectable } from '@nestjs/common';
import { InjectConnection } from '@nestjs/sequelize';
import { HealthIndicatorService } from '@nestjs/terminus';
import type { Sequelize } from 'sequelize-typescript';
import { schemaStatus } from '../database/schema-status.js';

/**
 * MariaDB reachability, with the server version and how far migrations got.
 * (Terminus' own Sequelize indicator issues a query without a type, which the
 * mariadb connector refuses.)
 */
@Injectable()
export class DatabaseHealthIndicator {
  constructor(
    private readonly health: HealthIndicatorService,
    @InjectConnection() private readonly sequelize: Sequelize,
  ) {}

  check(key = 'database') {
    return this.health
      .check(key)
      .attempt(() => schemaStatus(this.sequelize))
      .withTimeout(3000);
  }
}
