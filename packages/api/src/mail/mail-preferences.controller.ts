/** The signed-in person's own mail preferences (their profile page). */
import { Body, Controller, Get, Inject, Put } from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { type Actor, CurrentActor } from '../auth/actor.js';
import { AnySignedIn, AuditorMayWrite } from '../auth/index.js';
import { ApiProblems } from '../common/problem.dto.js';
import { MailPreferencesDto, UpdateMailPreferencesDto } from './dto/mail.dto.js';
import { MailPreferencesService } from './mail-preferences.service.js';

@ApiProblems()
@ApiTags('mail')
@Controller('me/mail-preferences')
@AnySignedIn()
export class MailPreferencesController {
  constructor(
    @Inject(MailPreferencesService) private readonly preferences: MailPreferencesService,
  ) {}

  @Get()
  @ApiOperation({ summary: 'Every kind of e-mail Cairn sends, and whether you receive it' })
  @ApiOkResponse({ type: MailPreferencesDto })
  get(@CurrentActor() actor: Actor): Promise<MailPreferencesDto> {
    return this.preferences.get(actor);
  }

  @Put()
  @AuditorMayWrite()
  @ApiOperation({ summary: 'Chooses the kinds of e-mail you do not want' })
  @ApiOkResponse({ type: MailPreferencesDto })
  set(
    @CurrentActor() actor: Actor,
    @Body() body: UpdateMailPreferencesDto,
  ): Promise<MailPreferencesDto> {
    return this.preferences.set(actor, body.optedOut);
  }
}
