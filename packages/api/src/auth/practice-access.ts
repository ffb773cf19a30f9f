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

  async find(practiceId: number): Promise<(PracticeRef & { code: string }) | null> {
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
        `The address names a practice by Cairn's number for it, a whole number; "${String(practiceId)}" is not one.`,
      );
    }
    const practice = await this.find(id);
    if (!practice || (practice.regionId !== user.regionId && user.role !== 'practice_lead')) {
      // The practice's code is not told to someone outside its region: the address is all they gave.
      throw new ProblemException(
        HttpStatus.NOT_FOUND,
        'practice-not-found',
        'No such practice',
        'The practice this address names is not one of your region’s practices. The link may be old, or the address mistyped.',
        { practiceId: id },
      );
    }
    if (!canReadPractice(user, practice)) {
      const own = (await this.organisations.practiceRefs(user.practiceIds)).map((p) => p.code);
      throw new ProblemException(
        HttpStatus.FORBIDDEN,
        'practice-not-yours',
        'Not one of your practices',
        user.role === 'practice_lead'
          ? `You lead ${own.length === 1 ? 'one practice' : `${own.length} practices`}${own.length > 0 ? ` (${own.join(', ')})` : ''}, and ${practice.code} is not among them. Ask your regional lead if you should have access.`
          : `${practice.code} belongs to another region.`,
        { practiceId: id, practiceCode: practice.code },
      );
    }
    return { id: practice.id, regionId: practice.regionId };
  }
}
