/** The views of a practice that the API sends: a reference, and the region's list entry. */
import { ApiProperty } from '@nestjs/swagger';

/** A practice as other resources name it (a submission's, a user's, an audit event's). */
export class PracticeRefDto {
  @ApiProperty({ type: Number, example: 12 })
  id!: number;

  @ApiProperty({ type: String, example: 'OV102', description: "The practice's code in Cairn" })
  code!: string;

  @ApiProperty({ type: String, example: 'Quarrybank Surgery' })
  name!: string;
}

/** A practice of the region, with its locality (pickers and coverage). */
export class PracticeDto extends PracticeRefDto {
  @ApiProperty({ type: String, nullable: true, example: 'Harnleigh Fold' })
  localityName!: string | null;
}
