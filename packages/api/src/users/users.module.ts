import { Module } from '@nestjs/common';
import { SequelizeModule } from '@nestjs/sequelize';
import { Membership } from './models/membership.model.js';
import { User } from './models/user.model.js';

@Module({
  imports: [SequelizeModule.forFeature([User, Membership])],
  exports: [SequelizeModule],
})
export class UsersModule {}
