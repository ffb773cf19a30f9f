/**
 * A person's own mail preferences (their profile page): every kind of e-mail
 * Cairn sends, whether their role is sent it, and whether they chose not to
 * receive it. Stored by the users module (UsersService.setMailOptOuts).
 */
import { Inject, Injectable } from '@nestjs/common';
import type { Actor } from '../auth/actor.js';
import { UsersService } from '../users/users.service.js';
import type { MailPreferencesDto } from './dto/mail.dto.js';
import { describeKinds, MAIL_KIND_INFO, MAIL_KINDS, type MailKind } from './mail-kinds.js';

@Injectable()
export class MailPreferencesService {
  constructor(@Inject(UsersService) private readonly users: UsersService) {}

  async get(actor: Actor): Promise<MailPreferencesDto> {
    return this.view(actor, await this.users.mailOptOuts(actor.id ?? -1));
  }

  async set(actor: Actor, optedOut: readonly MailKind[]): Promise<MailPreferencesDto> {
    const stored = await this.users.setMailOptOuts(actor, optedOut, describeKinds);
    return this.view(actor, stored);
  }

  private view(actor: Actor, optedOut: readonly string[]): MailPreferencesDto {
    return {
      preferences: MAIL_KINDS.map((kind) => {
        const info = MAIL_KIND_INFO[kind];
        return {
          kind,
          label: info.label,
          description: info.description,
          sentTo: [...info.sentTo],
          appliesToYou: actor.role !== 'system' && info.sentTo.includes(actor.role),
          receive: !optedOut.includes(kind),
        };
      }),
    };
  }
}
