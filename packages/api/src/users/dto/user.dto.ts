import { ApiProperty } from '@nestjs/swagger';
import { Transform, Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsEmail,
  IsIn,
  IsInt,
  IsOptional,
  IsString,
  Length,
  Matches,
  MaxLength,
  Min,
} from 'class-validator';
import { PracticeDto, PracticeRefDto } from '../../organisations/dto/practice.dto.js';
import { ROLES, type Role, USER_STATUSES, type UserStatus } from '../roles.js';

const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);

export class UserDto {
  @ApiProperty({ type: Number })
  id!: number;

  @ApiProperty({ type: String, example: 'priya.calloway@quarrybank.example' })
  email!: string;

  @ApiProperty({ type: String, example: 'Priya Calloway' })
  displayName!: string;

  @ApiProperty({ enum: ROLES, enumName: 'Role' })
  role!: Role;

  @ApiProperty({ enum: USER_STATUSES, enumName: 'UserStatus' })
  status!: UserStatus;

  @ApiProperty({
    type: [PracticeRefDto],
    description: 'Practices this person leads (practice leads), by code',
  })
  practices!: PracticeRefDto[];

  @ApiProperty({
    nullable: true,
    type: String,
    description: 'ISO 8601, or null if never signed in',
  })
  lastSignInAt!: string | null;

  @ApiProperty({ type: String, description: 'ISO 8601' })
  createdAt!: string;
}

export class UserListDto {
  @ApiProperty({ type: [UserDto] })
  users!: UserDto[];

  @ApiProperty({
    type: Boolean,
    description:
      "True when roles and practices come from the identity provider at each sign-in (changes made here last until the person's next sign-in)",
  })
  trustIdpRoles!: boolean;
}

export class UserOptionsDto {
  @ApiProperty({ type: [PracticeDto], description: "The region's practices, by code" })
  practices!: PracticeDto[];

  @ApiProperty({ type: Boolean })
  trustIdpRoles!: boolean;
}

export class ListUsersQuery {
  @ApiProperty({ required: false, description: 'Part of a name or e-mail address' })
  @IsOptional()
  @Transform(trim)
  @IsString()
  @MaxLength(100)
  search?: string;

  @ApiProperty({ required: false, enum: ROLES, enumName: 'Role' })
  @IsOptional()
  @IsIn(ROLES, { message: `role must be one of: ${ROLES.join(', ')}` })
  role?: Role;

  @ApiProperty({ required: false, enum: USER_STATUSES, enumName: 'UserStatus' })
  @IsOptional()
  @IsIn(USER_STATUSES, { message: `status must be one of: ${USER_STATUSES.join(', ')}` })
  status?: UserStatus;

  @ApiProperty({ required: false, description: 'Only people who lead this practice' })
  @IsOptional()
  @Type(() => Number)
  @IsInt({ message: 'practiceId must be a whole number' })
  @Min(1)
  practiceId?: number;
}

export class CreateUserDto {
  @ApiProperty({ example: 'new.lead@practice.example' })
  @Transform(({ value }) => (typeof value === 'string' ? value.trim().toLowerCase() : value))
  @IsEmail({}, { message: 'email must be an e-mail address such as name@practice.example' })
  @MaxLength(254)
  email!: string;

  @ApiProperty({ example: 'Alex Example' })
  @Transform(trim)
  @IsString()
  @Length(1, 200, { message: 'displayName must be 1 to 200 characters' })
  @Matches(/\S/, { message: 'displayName must not be blank' })
  displayName!: string;

  @ApiProperty({ enum: ROLES, enumName: 'Role' })
  @IsIn(ROLES, { message: `role must be one of: ${ROLES.join(', ')}` })
  role!: Role;

  @ApiProperty({
    required: false,
    type: [Number],
    description: 'Practice ids (practice leads only)',
  })
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(500)
  @IsInt({ each: true, message: 'practiceIds must be whole numbers' })
  practiceIds?: number[];
}

export class UpdateUserDto {
  @ApiProperty({ required: false, type: String })
  @IsOptional()
  @Transform(trim)
  @IsString()
  @Length(1, 200, { message: 'displayName must be 1 to 200 characters' })
  @Matches(/\S/, { message: 'displayName must not be blank' })
  displayName?: string;

  @ApiProperty({
    required: false,
    enum: ROLES,
    enumName: 'Role',
    description: "Changing a practice lead's role removes their practices",
  })
  @IsOptional()
  @IsIn(ROLES, { message: `role must be one of: ${ROLES.join(', ')}` })
  role?: Role;
}
