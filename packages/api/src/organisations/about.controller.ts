import { Controller, Get } from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiProperty, ApiTags } from '@nestjs/swagger';
import { OrganisationsService } from './organisations.service.js';
import { version } from '../version.js';
import { Public } from '../auth/decorators.js';

export class AboutDto {
  @ApiProperty({ example: 'Cairn' })
  product!: string;

  @ApiProperty({ example: '0.1.0' })
  version!: string;

  @ApiProperty({ nullable: true, type: String, description: 'The region this deployment serves' })
  regionName!: string | null;

  @ApiProperty({ example: 30 })
  practices!: number;

  @ApiProperty({ example: 4 })
  localities!: number;

  @ApiProperty({ description: 'The caution every screen that could steer care carries' })
  clinicalCaution!: string;
}

export const CLINICAL_CAUTION =
  'Cairn supports clinical audit and quality improvement. It is not clinical advice and not a decision tool for individual care: follow local guidelines and use clinical judgement.';

/** Public facts for the signed-out landing page: no personal or practice-level data. */
@ApiTags('about')
@Public()
@Controller('about')
export class AboutController {
  constructor(private readonly organisations: OrganisationsService) {}

  @Get()
  @ApiOperation({ summary: 'What this deployment is (public, for the landing page)' })
  @ApiOkResponse({ type: AboutDto })
  async about(): Promise<AboutDto> {
    const region = await this.organisations.primaryRegion();
    return {
      product: 'Cairn',
      version,
      regionName: region?.name ?? null,
      practices: region ? await this.organisations.practiceCount(region.id) : 0,
      localities: region ? await this.organisations.localityCount(region.id) : 0,
      clinicalCaution: CLINICAL_CAUTION,
    };
  }
}
