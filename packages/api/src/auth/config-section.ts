import type { ConfigService } from '@nestjs/config';
import type { AppConfigService } from '../config/config.module.js';
import type { CairnConfig } from '../config/config.schema.js';

/** One typed section of the validated configuration. */
export function section<K extends keyof CairnConfig>(
  config: ConfigService,
  key: K,
): CairnConfig[K] {
  return (config as unknown as AppConfigService).get(key, { infer: true }) as CairnConfig[K];
}
