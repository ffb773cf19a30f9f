/** Describes the signed-in person for the web (GET /api/session and /api/me). */
import { Inject, Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectModel } from '@nestjs/sequelize';
import type { Request } from 'express';
import { Practice } from '../organisations/models/practice.model.js';
import { Region } from '../organisations/models/region.model.js';
import type { AuthUser } from './auth-user.js';
import type { SessionAuth } from './session-data.js';
import { section } from './config-section.js';

@Injectable()
export class MeService {
  constructor(
    @InjectModel(Region) private readonly regions: typeof Region,
    @InjectModel(Practice) private readonly practices: typeof Practice,
    @Inject(ConfigService) private readonly config: ConfigService,
  ) {}

  async describe(user: AuthUser, req: Request) {
    const [region, practices] = await Promise.all([
      this.regions.findByPk(user.regionId, { attributes: ['name'] }),
      user.practiceIds.length
        ? this.practices.findAll({
            where: { id: user.practiceIds },
            attributes: ['id', 'code', 'name'],
            order: [['code', 'ASC']],
          })
        : Promise.resolve([]),
    ]);
    const auth = (req as Request & { session?: { auth?: SessionAuth } }).session?.auth;
    const hours = section(this.config, 'session').absoluteTimeoutHours;
    return {
      id: user.id,
      email: user.email,
      displayName: user.displayName,
      role: user.role,
      regionName: region?.name ?? '',
      practices: practices.map((p) => ({ id: p.id, code: p.code, name: p.name })),
      sessionExpiresAt: new Date((auth?.signedInAt ?? Date.now()) + hours * 3600_000).toISOString(),
    };
  }
}
