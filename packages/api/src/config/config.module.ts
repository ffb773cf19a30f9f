import { Global, Module } from '@nestjs/common';
import { ConfigModule, ConfigService } from '@nestjs/config';
import type { CairnConfig, CairnSecrets } from './config.schema.js';
import { loadConfig, loadSecrets } from './load-config.js';

export const CAIRN_SECRETS = Symbol('CAIRN_SECRETS');

/** Typed access to the validated configuration: `config.get('database.port', { infer: true })`. */
export type AppConfigService = ConfigService<CairnConfig, true>;

/**
 * Global configuration. `overrides` lets tests adjust a loaded configuration
 * (for instance the database name) without touching files or the process env.
 */
@Global()
@Module({})
export class CairnConfigModule {
  static forRoot(options: { config?: CairnConfig; secrets?: CairnSecrets } = {}) {
    const config = options.config ?? loadConfig();
    const secrets = options.secrets ?? loadSecrets();
    return {
      module: CairnConfigModule,
      imports: [
        ConfigModule.forRoot({
          isGlobal: true,
          ignoreEnvFile: true,
          ignoreEnvVars: true,
          load: [() => config],
        }),
      ],
      providers: [{ provide: CAIRN_SECRETS, useValue: secrets }],
      exports: [ConfigModule, CAIRN_SECRETS],
    };
  }
}
