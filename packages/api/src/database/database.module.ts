import { Logger, Module } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { SequelizeModule } from '@nestjs/sequelize';
import type { CairnSecrets } from '../config/config.schema.js';
import { type AppConfigService, CAIRN_SECRETS } from '../config/config.module.js';
import { sequelizeOptions } from './sequelize-options.js';

/**
 * The application's one Sequelize connection (mariadb connector). Models are
 * registered by each feature module with SequelizeModule.forFeature and
 * loaded automatically; the schema comes only from migrations.
 */
@Module({
  imports: [
    SequelizeModule.forRootAsync({
      inject: [ConfigService, CAIRN_SECRETS],
      useFactory: (config: AppConfigService, secrets: CairnSecrets) => {
        const logger = new Logger('SQL');
        return {
          ...sequelizeOptions(
            config.get('database', { infer: true }),
            secrets.CAIRN_DATABASE_PASSWORD,
            {
              logging: (sql: string) => logger.debug(sql),
            },
          ),
          autoLoadModels: true,
          synchronize: false,
          retryAttempts: 3,
          retryDelay: 1000,
        };
      },
    }),
  ],
})
export class DatabaseModule {}
