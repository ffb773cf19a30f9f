import { Module } from '@nestjs/common';
import { SequelizeModule } from '@nestjs/sequelize';
import { OrganisationsModule } from '../organisations/organisations.module.js';
import { Membership } from './models/membership.model.js';
import { User } from './models/user.model.js';
import { UserAccounts } from './user-accounts.js';
import { UsersController } from './users.controller.js';
import { UsersService } from './users.service.js';

@Module({
  imports: [SequelizeModule.forFeature([User, Membership]), OrganisationsModule],
  controllers: [UsersController],
  providers: [UsersService, UserAccounts],
  exports: [UsersService, UserAccounts],
})
export class UsersModule {}
