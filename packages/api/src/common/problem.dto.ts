/** RFC 9457 problem details as the OpenAPI document describes them (every error answer). */
import { ApiDefaultResponse, ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';

export class FieldProblemDto {
  @ApiProperty({ type: String, example: 'practiceIds.0', description: 'The field concerned' })
  field!: string;

  @ApiProperty({ type: String, example: 'must be a whole number' })
  message!: string;
}

export class ProblemDto {
  @ApiProperty({
    type: String,
    example: '/api/problems/validation',
    description: 'Kind of problem',
  })
  type!: string;

  @ApiProperty({ type: String, example: 'The request is not valid' })
  title!: string;

  @ApiProperty({ type: Number, example: 400 })
  status!: number;

  @ApiPropertyOptional({ type: String, description: 'What happened here, in plain words' })
  detail?: string;

  @ApiPropertyOptional({ type: String })
  instance?: string;

  @ApiPropertyOptional({ type: [FieldProblemDto], description: 'Field problems (validation)' })
  errors?: FieldProblemDto[];
}

/** Every route of a controller may answer with problem details. */
export const ApiProblems = () =>
  ApiDefaultResponse({ type: ProblemDto, description: 'RFC 9457 problem details' });
