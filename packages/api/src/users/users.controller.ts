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
  Req,
} from '@nestjs/common';
import { ApiCreatedResponse, ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Request } from 'express';
import type { AuthUser } from '../auth/auth-user.js';
import { CurrentUser, PracticeScoped, Roles } from '../auth/decorators.js';
import {
  CreateUserDto,
  ListUsersQuery,
  UpdateUserDto,
  UserDto,
  UserListDto,
  UserOptionsDto,
} from './dto/user.dto.js';
import { type ChangeContext, UsersService } from './users.service.js';

const context = (actor: AuthUser, req: Request): ChangeContext => ({
  actor,
  requestId: (req as Request & { id?: string }).id ?? null,
  ipAddress: req.ip ?? null,
});

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
  async list(@CurrentUser() user: AuthUser, @Query() query: ListUsersQuery): Promise<UserListDto> {
    return {
      users: await this.users.list(user.regionId, query),
      trustIdpRoles: this.users.trustIdpRoles,
    };
  }

  @Get('options')
  @ApiOperation({ summary: 'What the users screen offers: the practices that can be assigned' })
  @ApiOkResponse({ type: UserOptionsDto })
  options(@CurrentUser() user: AuthUser): Promise<UserOptionsDto> {
    return this.users.options(user.regionId);
  }

  @Get(':userId')
  @ApiOkResponse({ type: UserDto })
  get(
    @CurrentUser() user: AuthUser,
    @Param('userId', ParseIntPipe) userId: number,
  ): Promise<UserDto> {
    return this.users.get(user.regionId, userId);
  }

  @Post()
  @ApiOperation({ summary: 'Adds a person who may then sign in' })
  @ApiCreatedResponse({ type: UserDto })
  create(
    @CurrentUser() user: AuthUser,
    @Req() req: Request,
    @Body() dto: CreateUserDto,
  ): Promise<UserDto> {
    return this.users.create(dto, context(user, req));
  }

  @Patch(':userId')
  @ApiOperation({
    summary:
      "Renames a person or changes their role (a practice lead's practices go with the old role)",
  })
  @ApiOkResponse({ type: UserDto })
  update(
    @CurrentUser() user: AuthUser,
    @Req() req: Request,
    @Param('userId', ParseIntPipe) userId: number,
    @Body() dto: UpdateUserDto,
  ): Promise<UserDto> {
    return this.users.update(userId, dto, context(user, req));
  }

  @Put(':userId/practices/:practiceId')
  @PracticeScoped('practiceId')
  @ApiOperation({ summary: 'Makes a practice lead a lead of one more practice' })
  @ApiOkResponse({ type: UserDto })
  assign(
    @CurrentUser() user: AuthUser,
    @Req() req: Request,
    @Param('userId', ParseIntPipe) userId: number,
    @Param('practiceId', ParseIntPipe) practiceId: number,
  ): Promise<UserDto> {
    return this.users.assignPractice(userId, practiceId, context(user, req));
  }

  @Delete(':userId/practices/:practiceId')
  @PracticeScoped('practiceId')
  @ApiOperation({ summary: 'Removes a practice from a practice lead' })
  @ApiOkResponse({ type: UserDto })
  remove(
    @CurrentUser() user: AuthUser,
    @Req() req: Request,
    @Param('userId', ParseIntPipe) userId: number,
    @Param('practiceId', ParseIntPipe) practiceId: number,
  ): Promise<UserDto> {
    return this.users.removePractice(userId, practiceId, context(user, req));
  }

  @Post(':userId/deactivate')
  @HttpCode(200)
  @ApiOperation({ summary: 'Deactivates a person: their sessions end and they cannot sign in' })
  @ApiOkResponse({ type: UserDto })
  deactivate(
    @CurrentUser() user: AuthUser,
    @Req() req: Request,
    @Param('userId', ParseIntPipe) userId: number,
  ): Promise<UserDto> {
    return this.users.setStatus(userId, 'deactivated', context(user, req));
  }

  @Post(':userId/reactivate')
  @HttpCode(200)
  @ApiOperation({ summary: 'Lets a deactivated person sign in again' })
  @ApiOkResponse({ type: UserDto })
  reactivate(
    @CurrentUser() user: AuthUser,
    @Req() req: Request,
    @Param('userId', ParseIntPipe) userId: number,
  ): Promise<UserDto> {
    return this.users.setStatus(userId, 'active', context(user, req));
  }
}
