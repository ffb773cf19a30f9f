/** The regional lead's users screen API: people, their roles and practices. */
import {
  Body,
  Controller,
  Delete,
  Get,
  HttpCode,
  Inject,
  Param,
  ParseIntPipe,
  Patch,
  Post,
  Put,
  Query,
} from '@nestjs/common';
import { ApiCreatedResponse, ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { type Actor, CurrentActor } from '../auth/actor.js';
import { PracticeScoped, Roles } from '../auth/decorators.js';
import {
  CreateUserDto,
  ListUsersQuery,
  UpdateUserDto,
  UserDto,
  UserListDto,
  UserOptionsDto,
} from './dto/user.dto.js';
import { UsersService } from './users.service.js';
import { ApiProblems } from '../common/problem.dto.js';

@ApiProblems()
@ApiTags('users')
@Controller('users')
@Roles('regional_lead')
export class UsersController {
  constructor(@Inject(UsersService) private readonly users: UsersService) {}

  @Get()
  @ApiOperation({
    summary: "The region's people, filtered by search text, role, status or practice",
  })
  @ApiOkResponse({ type: UserListDto })
  list(@CurrentActor() actor: Actor, @Query() query: ListUsersQuery): Promise<UserListDto> {
    return this.users.list(actor.regionId, query);
  }

  @Get('options')
  @ApiOperation({ summary: 'What the users screen offers: the practices that can be assigned' })
  @ApiOkResponse({ type: UserOptionsDto })
  options(@CurrentActor() actor: Actor): Promise<UserOptionsDto> {
    return this.users.options(actor.regionId);
  }

  @Get(':userId')
  @ApiOkResponse({ type: UserDto })
  get(
    @CurrentActor() actor: Actor,
    @Param('userId', ParseIntPipe) userId: number,
  ): Promise<UserDto> {
    return this.users.get(actor.regionId, userId);
  }

  @Post()
  @ApiOperation({ summary: 'Adds a person who may then sign in' })
  @ApiCreatedResponse({ type: UserDto })
  create(@CurrentActor() actor: Actor, @Body() dto: CreateUserDto): Promise<UserDto> {
    return this.users.create(dto, actor);
  }

  @Patch(':userId')
  @ApiOperation({
    summary:
      "Renames a person or changes their role (a practice lead's practices go with the old role)",
  })
  @ApiOkResponse({ type: UserDto })
  update(
    @CurrentActor() actor: Actor,
    @Param('userId', ParseIntPipe) userId: number,
    @Body() dto: UpdateUserDto,
  ): Promise<UserDto> {
    return this.users.update(userId, dto, actor);
  }

  @Put(':userId/practices/:practiceId')
  @PracticeScoped('practiceId')
  @ApiOperation({ summary: 'Makes a practice lead a lead of one more practice' })
  @ApiOkResponse({ type: UserDto })
  assign(
    @CurrentActor() actor: Actor,
    @Param('userId', ParseIntPipe) userId: number,
    @Param('practiceId', ParseIntPipe) practiceId: number,
  ): Promise<UserDto> {
    return this.users.assignPractice(userId, practiceId, actor);
  }

  @Delete(':userId/practices/:practiceId')
  @PracticeScoped('practiceId')
  @ApiOperation({ summary: 'Removes a practice from a practice lead' })
  @ApiOkResponse({ type: UserDto })
  remove(
    @CurrentActor() actor: Actor,
    @Param('userId', ParseIntPipe) userId: number,
    @Param('practiceId', ParseIntPipe) practiceId: number,
  ): Promise<UserDto> {
    return this.users.removePractice(userId, practiceId, actor);
  }

  @Post(':userId/deactivate')
  @HttpCode(200)
  @ApiOperation({ summary: 'Deactivates a person: their sessions end and they cannot sign in' })
  @ApiOkResponse({ type: UserDto })
  deactivate(
    @CurrentActor() actor: Actor,
    @Param('userId', ParseIntPipe) userId: number,
  ): Promise<UserDto> {
    return this.users.setStatus(userId, 'deactivated', actor);
  }

  @Post(':userId/reactivate')
  @HttpCode(200)
  @ApiOperation({ summary: 'Lets a deactivated person sign in again' })
  @ApiOkResponse({ type: UserDto })
  reactivate(
    @CurrentActor() actor: Actor,
    @Param('userId', ParseIntPipe) userId: number,
  ): Promise<UserDto> {
    return this.users.setStatus(userId, 'active', actor);
  }
}
