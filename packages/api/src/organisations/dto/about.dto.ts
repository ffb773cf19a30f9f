import { ApiProperty } from '@nestjs/swagger';

export class AboutDto {
  @ApiProperty({ type: String, example: 'Cairn' })
  product!: string;

  @ApiProperty({ type: String, example: '0.1.0' })
  version!: string;

  @ApiProperty({ nullable: true, type: String, description: 'The region this deployment serves' })
  regionName!: string | null;

  @ApiProperty({ type: Number, example: 30 })
  practices!: number;

  @ApiProperty({ type: Number, example: 4 })
  localities!: number;

  @ApiProperty({
    type: String,
    description: 'The caution every screen that could steer care carries',
  })
  clinicalCaution!: string;
}
