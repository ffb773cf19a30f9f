/** The signed-in person and the session, as the web reads them on every load. */
import { ApiProperty } from '@nestjs/swagger';
import { PracticeRefDto } from '../../organisations/dto/practice.dto.js';
import { ROLES, type Role } from '../../users/roles.js';

export const SESSION_ENDS = ['idle', 'absolute', 'deactivated', 'removed'] as const;
export type SessionEnd = (typeof SESSION_ENDS)[number];

export class MeDto {
  @ApiProperty({ type: Number })
  id!: number;

  @ApiProperty({ type: String, example: 'priya.calloway@quarrybank.example' })
  email!: string;

  @ApiProperty({ type: String, example: 'Priya Calloway' })
  displayName!: string;

  @ApiProperty({ enum: ROLES, enumName: 'Role' })
  role!: Role;

  @ApiProperty({ type: String, example: 'Ostrevale' })
  regionName!: string;

  @ApiProperty({
    type: [PracticeRefDto],
    description: 'The practices this person leads (practice leads only), by code',
  })
  practices!: PracticeRefDto[];

  @ApiProperty({
    type: String,
    description: 'When the session ends at the latest (absolute timeout), ISO 8601',
  })
  sessionExpiresAt!: string;
}

export class SessionDto {
  @ApiProperty({ nullable: true, type: MeDto, description: 'The signed-in person, or null' })
  user!: MeDto | null;

  @ApiProperty({
    nullable: true,
    type: String,
    description:
      'Send this as the X-CSRF-Token header on every state-changing request; null when signed out',
  })
  csrfToken!: string | null;

  @ApiProperty({
    nullable: true,
    enum: SESSION_ENDS,
    enumName: 'SessionEnd',
    description: 'Set when a session ended on this request (why the person is signed out)',
  })
  sessionEnded!: SessionEnd | null;

  @ApiProperty({
    type: Boolean,
    description: 'True when sign-in goes through the local fake identity provider (development)',
  })
  localSignIn!: boolean;
}
