/**
 * Tells digests how many review cases wait for each practice's answer: the
 * digests module asks through OpenReviewCases, and this module registers its
 * count there when it starts.
 */
import { Inject, Injectable, type OnModuleInit } from '@nestjs/common';
import { OpenReviewCases } from '../digests/review-case-counts.js';
import { ReviewCaseRepository } from './review-case.repository.js';

@Injectable()
export class DigestCaseCount implements OnModuleInit {
  constructor(
    @Inject(OpenReviewCases) private readonly openCases: OpenReviewCases,
    @Inject(ReviewCaseRepository) private readonly cases: ReviewCaseRepository,
  ) {}

  onModuleInit(): void {
    this.openCases.register((practiceId, regionId) =>
      this.cases.countAwaitingPractice(practiceId, regionId),
    );
  }
}
