/** Describes the signed-in person for the web (GET /api/session and /api/me). */
import { Inject, Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { OrganisationsService } from '../organisations/organisations.service.js';
import type { AuthUser } from './auth-user.js';
import { section } from './config-section.js';
import type { MeDto } from './dto/session.dto.js';

@Injectable()
export class MeService {
  constructor(
    @Inject(OrganisationsService) private readonly organisations: OrganisationsService,
    @Inject(ConfigService) private readonly config: ConfigService,
  ) {}

  /** `signedInAt`: epoch milliseconds of the sign-in (the absolute timeout counts from it). */
  async describe(user: AuthUser, signedInAt: number | undefined): Promise<MeDto> {
    const [region, practices] = await Promise.all([
      this.organisations.region(user.regionId),
      this.organisations.practiceRefs(user.practiceIds),
    ]);
    const hours = section(this.config, 'session').absoluteTimeoutHours;
    return {
      id: user.id,
      email: user.email,
      displayName: user.displayName,
      role: user.role,
      regionName: region?.name ?? '',
      practices,
      sessionExpiresAt: new Date((signedInAt ?? Date.now()) + hours * 3600_000).toISOString(),
    };
  }
}
