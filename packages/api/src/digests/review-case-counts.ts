/**
 * How many review cases wait for a practice's answer. The review-case module
 * registers its counter here when it is present; until then every practice has
 * none, and the digest says so. (An optional provider, so that digests do not
 * depend on the module that runs review cases.)
 */
import { Injectable } from '@nestjs/common';

export type OpenReviewCaseCounter = (practiceId: number, regionId: number) => Promise<number>;

@Injectable()
export class OpenReviewCases {
  private counter: OpenReviewCaseCounter | null = null;

  register(counter: OpenReviewCaseCounter): void {
    if (this.counter) throw new Error('a review-case counter is registered already');
    this.counter = counter;
  }

  get registered(): boolean {
    return this.counter !== null;
  }

  count(practiceId: number, regionId: number): Promise<number> {
    return this.counter ? this.counter(practiceId, regionId) : Promise.resolve(0);
  }
}
