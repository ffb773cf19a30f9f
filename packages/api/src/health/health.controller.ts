import { Controller, Get, HttpStatus, Inject } from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { HealthCheckService } from '@nestjs/terminus';
import { ProblemException } from '../common/problem.js';
import { DatabaseHealthIndicator } from './database.health.js';
import { type HealthDatabaseDto, HealthDto } from './dto/health.dto.js';
import { Public } from '../auth/decorators.js';
import { ApiProblems } from '../common/problem.dto.js';

const startedAt = new Date();

@ApiProblems()
@ApiTags('health')
@Public()
@Controller('health')
export class HealthController {
  constructor(
    @Inject(HealthCheckService) private readonly health: HealthCheckService,
    @Inject(DatabaseHealthIndicator) private readonly database: DatabaseHealthIndicator,
  ) {}

  @Get()
  @ApiOperation({
    summary: 'Process and database status (200 when healthy, 503 problem details when not)',
  })
  @ApiOkResponse({ type: HealthDto })
  async check(): Promise<HealthDto> {
    const processInfo = {
      status: 'up' as const,
      pid: process.pid,
      startedAt: startedAt.toISOString(),
      uptimeSeconds: Math.round(process.uptime()),
      rssMegabytes: Math.round(process.memoryUsage().rss / 1048576),
      node: process.version,
    };
    try {
      const result = await this.health.check([() => this.database.check('database')]);
      return {
        status: 'ok',
        process: processInfo,
        database: result.details.database as HealthDatabaseDto,
      };
    } catch (error) {
      const response = (
        error as { getResponse?: () => { details?: Record<string, unknown> } }
      ).getResponse?.();
      throw new ProblemException(
        HttpStatus.SERVICE_UNAVAILABLE,
        'unhealthy',
        'Cairn is not healthy',
        'The database does not answer. Check that MariaDB is running and reachable with the configured credentials.',
        { process: processInfo, database: response?.details?.database ?? { status: 'down' } },
      );
    }
  }
}
