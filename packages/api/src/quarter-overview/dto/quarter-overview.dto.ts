/** The audit quarters page: every quarter of the region with its coverage, reports and actions. */
import { ApiProperty } from '@nestjs/swagger';
import { QuarterActionsDto, QuarterDto, QuarterReportDto } from '../../quarters/dto/quarter.dto.js';
import { CoverageTotalsDto } from '../../submissions/dto/submission.dto.js';

export class MeasureSetRefDto {
  @ApiProperty({ type: String, example: 'cairn-default-2026.1' })
  id!: string;

  @ApiProperty({ type: String, example: 'Cairn default measure set 2026.1' })
  label!: string;
}

export class AuditQuarterDto {
  @ApiProperty({ type: QuarterDto })
  quarter!: QuarterDto;

  @ApiProperty({ type: MeasureSetRefDto })
  measureSet!: MeasureSetRefDto;

  @ApiProperty({
    type: CoverageTotalsDto,
    nullable: true,
    description:
      'Practices with a current submission, awaiting confirmation, or none (regional lead and auditor; null for others)',
  })
  coverage!: CoverageTotalsDto | null;

  @ApiProperty({ type: [QuarterReportDto], description: 'Reports published from it, newest first' })
  reports!: QuarterReportDto[];

  @ApiProperty({ type: QuarterActionsDto })
  actions!: QuarterActionsDto;
}

/** The quarter that would be opened next, with the defaults the form offers. */
export class NextQuarterDto {
  @ApiProperty({ type: Number, example: 2026 })
  year!: number;

  @ApiProperty({ type: Number, enum: [1, 2, 3, 4], example: 4 })
  quarter!: 1 | 2 | 3 | 4;

  @ApiProperty({ type: String, example: '2026 Q4' })
  label!: string;

  @ApiProperty({
    type: String,
    example: '2026-01',
    description: 'First month of the review window',
  })
  windowStart!: string;

  @ApiProperty({ type: String, example: '2026-12', description: 'Last month of the review window' })
  windowEnd!: string;

  @ApiProperty({ type: String, example: '2026-12-31', description: 'Last day of the quarter' })
  quarterEnd!: string;

  @ApiProperty({ type: String, example: '2027-02-14' })
  defaultDeadline!: string;

  @ApiProperty({ type: String, nullable: true, example: 'cairn-default-2026.1' })
  defaultMeasureSetId!: string | null;
}

export class AuditQuartersActionsDto {
  @ApiProperty({ type: Boolean, description: 'Open the next quarter' })
  open!: boolean;
}

export class AuditQuartersDto {
  @ApiProperty({ type: [AuditQuarterDto], description: 'Latest first' })
  quarters!: AuditQuarterDto[];

  @ApiProperty({ type: NextQuarterDto })
  next!: NextQuarterDto;

  @ApiProperty({
    type: [MeasureSetRefDto],
    description: 'The published measure-set versions a quarter of the region may use',
  })
  measureSets!: MeasureSetRefDto[];

  @ApiProperty({ type: AuditQuartersActionsDto })
  actions!: AuditQuartersActionsDto;
}
