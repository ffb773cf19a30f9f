import { Body, Controller, Get, HttpCode, Inject, Param, ParseIntPipe, Post } from '@nestjs/common';
import {
  ApiOkResponse,
  ApiOperation,
  ApiProperty,
  ApiPropertyOptional,
  ApiTags,
} from '@nestjs/swagger';
import {
  IsDateString,
  IsIn,
  IsInt,
  IsOptional,
  IsString,
  Matches,
  Max,
  Min,
} from 'class-validator';
import { AnySignedIn, type AuthUser, CurrentUser, Roles } from '../auth/index.js';
import { QuartersService } from './quarters.service.js';

export class QuarterDto {
  @ApiProperty() id!: number;
  @ApiProperty({ example: 2026 }) year!: number;
  @ApiProperty({ example: 3, enum: [1, 2, 3, 4] }) quarter!: number;
  @ApiProperty({ example: '2026 Q3' }) label!: string;
  @ApiProperty({ example: '2025-10', description: 'First month of the review window' })
  windowStart!: string;
  @ApiProperty({ example: '2026-09', description: 'Last month of the review window' })
  windowEnd!: string;
  @ApiProperty({ example: 'cairn-default-2026.1' }) measureSetId!: string;
  @ApiProperty({ example: '2026-12-16' }) submissionDeadline!: string;
  @ApiProperty({ enum: ['open', 'closed'] }) status!: string;
  @ApiProperty() openedAt!: string;
  @ApiProperty({ nullable: true, type: String }) closedAt!: string | null;
}

export class OpenQuarterDto {
  @ApiProperty({ example: 2026 })
  @IsInt()
  @Min(2000)
  @Max(2100)
  year!: number;

  @ApiProperty({ example: 4 })
  @IsInt()
  @IsIn([1, 2, 3, 4])
  quarter!: number;

  @ApiPropertyOptional({
    example: '2027-03-18',
    description: 'Default: a fixed number of days after the quarter ends',
  })
  @IsOptional()
  @IsDateString({ strict: true })
  submissionDeadline?: string;

  @ApiPropertyOptional({ example: 'cairn-default-2026.1' })
  @IsOptional()
  @IsString()
  @Matches(/^[a-z0-9][a-z0-9.-]{0,63}$/)
  measureSetId?: string;
}

@ApiTags('quarters')
@Controller('quarters')
export class QuartersController {
  constructor(@Inject(QuartersService) private readonly quarters: QuartersService) {}

  @Get()
  @AnySignedIn()
  @ApiOperation({ summary: 'The audit quarters of your region, latest first' })
  @ApiOkResponse({ type: [QuarterDto] })
  list(@CurrentUser() user: AuthUser) {
    return this.quarters.list(user.regionId);
  }

  @Get(':quarterId')
  @AnySignedIn()
  @ApiOperation({ summary: 'One audit quarter' })
  @ApiOkResponse({ type: QuarterDto })
  get(@CurrentUser() user: AuthUser, @Param('quarterId', ParseIntPipe) quarterId: number) {
    return this.quarters.get(user, quarterId);
  }

  @Post()
  @Roles('regional_lead')
  @ApiOperation({ summary: 'Open an audit quarter for submissions (regional lead)' })
  @ApiOkResponse({ type: QuarterDto })
  open(@CurrentUser() user: AuthUser, @Body() body: OpenQuarterDto) {
    return this.quarters.open({ id: user.id, label: user.email, regionId: user.regionId }, body);
  }

  @Post(':quarterId/close')
  @HttpCode(200)
  @Roles('regional_lead')
  @ApiOperation({ summary: 'Close a quarter to practice uploads (regional lead)' })
  @ApiOkResponse({ type: QuarterDto })
  close(@CurrentUser() user: AuthUser, @Param('quarterId', ParseIntPipe) quarterId: number) {
    return this.quarters.setStatus(
      { id: user.id, label: user.email, regionId: user.regionId },
      quarterId,
      'closed',
    );
  }

  @Post(':quarterId/reopen')
  @HttpCode(200)
  @Roles('regional_lead')
  @ApiOperation({ summary: 'Reopen a closed quarter (regional lead)' })
  @ApiOkResponse({ type: QuarterDto })
  reopen(@CurrentUser() user: AuthUser, @Param('quarterId', ParseIntPipe) quarterId: number) {
    return this.quarters.setStatus(
      { id: user.id, label: user.email, regionId: user.regionId },
      quarterId,
      'open',
    );
  }
}
