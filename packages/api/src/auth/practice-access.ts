/**
 * Practice-level access for services and the guard: may this person read
 * this practice? Regional leads and auditors: any practice of their region;
 * practice leads: the practices they lead. Unknown practice: 404.
 */
import { HttpStatus, Inject, Injectable } from '@nestjs/common';
import { ProblemException } from '../common/problem.js';
import { OrganisationsService } from '../organisations/organisations.service.js';
import { type AuthUser, canReadPractice, type PracticeRef } from './auth-user.js';

@Injectable()
export class PracticeAccess {
  constructor(@Inject(OrganisationsService) private readonly organisations: OrganisationsService) {}

  async find(practiceId: number): Promise<PracticeRef | null> {
    return this.organisations.practiceRegion(practiceId);
  }

  async canRead(user: AuthUser, practiceId: number): Promise<boolean> {
    const practice = await this.find(practiceId);
    return practice !== null && canReadPractice(user, practice);
  }

  /**
   * Throws problem details unless the person may read the practice:
   * 400 when the id is not a whole number, 404 when no such practice, 403 when not theirs.
   */
  async assertCanRead(
    user: AuthUser,
    practiceId: number | string | undefined,
  ): Promise<PracticeRef> {
    const id =
      typeof practiceId === 'number'
        ? practiceId
        : /^[1-9][0-9]{0,9}$/.test(practiceId ?? '')
          ? Number(practiceId)
          : NaN;
    if (!Number.isSafeInteger(id) || id <= 0) {
      throw new ProblemException(
        HttpStatus.BAD_REQUEST,
        'bad-practice-id',
        'Not a practice id',
        `The practice id in the address must be a whole number; "${String(practiceId)}" is not.`,
      );
    }
    const practice = await this.find(id);
    if (!practice || (practice.regionId !== user.regionId && user.role !== 'practice_lead')) {
      throw new ProblemException(
        HttpStatus.NOT_FOUND,
        'practice-not-found',
        'No such practice',
        `There is no practice ${id} in your region.`,
        { practiceId: id },
      );
    }
    if (!canReadPractice(user, practice)) {
      throw new ProblemException(
        HttpStatus.FORBIDDEN,
        'practice-not-yours',
        'Not one of your practices',
        user.role === 'practice_lead'
          ? `You lead ${user.practiceIds.length === 1 ? 'one practice' : `${user.practiceIds.length} practices`}, and practice ${id} is not among them. Ask your regional lead if you should have access.`
          : `Practice ${id} belongs to another region.`,
        { practiceId: id },
      );
    }
    return practice;
  }
}
