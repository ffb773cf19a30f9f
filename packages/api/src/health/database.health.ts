import { Injectable } from '@nestjs/common';
import { InjectConnection } from '@nestjs/sequelize';
import { HealthIndicatorService } from '@nestjs/terminus';
import { QueryTypes } from 'sequelize';
import type { Sequelize } from 'sequelize-typescript';

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
      .attempt(async () => {
        const [row] = await this.sequelize.query<{ version: string; migration: string | null }>(
          'SELECT VERSION() AS version, (SELECT MAX(name) FROM schema_migrations) AS migration',
          { type: QueryTypes.SELECT },
        );
        return { server: row?.version, schema: row?.migration };
      })
      .withTimeout(3000);
  }
}
