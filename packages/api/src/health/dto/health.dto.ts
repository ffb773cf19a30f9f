import { ApiProperty } from '@nestjs/swagger';

export class HealthProcessDto {
  @ApiProperty({ type: String, enum: ['up'] }) status!: 'up';
  @ApiProperty({ type: Number }) pid!: number;
  @ApiProperty({ type: String, description: 'ISO 8601' }) startedAt!: string;
  @ApiProperty({ type: Number }) uptimeSeconds!: number;
  @ApiProperty({ type: Number }) rssMegabytes!: number;
  @ApiProperty({ type: String, example: 'v20.20.2' }) node!: string;
}

export class HealthDatabaseDto {
  @ApiProperty({ type: String, enum: ['up', 'down'] }) status!: 'up' | 'down';
  @ApiProperty({ type: String, required: false, description: 'MariaDB server version' })
  server?: string;
  @ApiProperty({ type: String, nullable: true, required: false, description: 'Last migration' })
  schema?: string | null;
}

export class HealthDto {
  @ApiProperty({ type: String, enum: ['ok'] }) status!: 'ok';
  @ApiProperty({ type: HealthProcessDto }) process!: HealthProcessDto;
  @ApiProperty({ type: HealthDatabaseDto }) database!: HealthDatabaseDto;
}
