/** A bare Sequelize connection (no Nest) for the CLI and test set-up. */
import { Sequelize } from 'sequelize';
import type { CairnConfig, CairnSecrets } from '../config/config.schema.js';
import { sequelizeOptions } from './sequelize-options.js';

export function connect(
  config: CairnConfig,
  secrets: Pick<CairnSecrets, 'CAIRN_DATABASE_PASSWORD'>,
  database?: string,
): Sequelize {
  return new Sequelize(
    sequelizeOptions(
      config.database,
      secrets.CAIRN_DATABASE_PASSWORD,
      database ? { database } : {},
    ),
  );
}
