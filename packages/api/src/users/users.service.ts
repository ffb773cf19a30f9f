/**
 * The regional lead's management of people: list and filter, add, rename,
 * change role, assign and remove practices, deactivate and reactivate. Every
 * change is one transaction with its audit event. A regional lead cannot
 * deactivate themselves or change their own role, so a region always keeps
 * the regional lead who is making changes.
 */
import { HttpStatus, Inject, Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectModel } from '@nestjs/sequelize';
import { Op, type Transaction, type WhereOptions } from 'sequelize';
import type { Sequelize } from 'sequelize-typescript';
import { AuditTrailService } from '../audit-trail/audit-trail.service.js';
import type { Actor } from '../auth/actor.js';
import { section } from '../auth/config-section.js';
import { SessionService } from '../auth/session.service.js';
import { ProblemException } from '../common/problem.js';
import type { PracticeRefDto } from '../organisations/dto/practice.dto.js';
import { OrganisationsService } from '../organisations/organisations.service.js';
import type {
  CreateUserDto,
  ListUsersQuery,
  UpdateUserDto,
  UserDto,
  UserListDto,
  UserOptionsDto,
} from './dto/user.dto.js';
import { Membership } from './models/membership.model.js';
import { User } from './models/user.model.js';
import type { Role } from './roles.js';

/** A practice lead as mail reaches them (see practiceLeadsOf). */
export interface PracticeLeadContact {
  userId: number;
  email: string;
  displayName: string;
  practiceId: number;
  /** Kinds of e-mail they chose not to receive */
  mailOptOuts: string[];
}

const optOutList = (stored: string | null | undefined): string[] =>
  (stored ?? '').split(',').filter((kind) => kind.length > 0);

const roleLabel = (role: Role) =>
  ({ regional_lead: 'regional lead', practice_lead: 'practice lead', auditor: 'auditor' })[role];

@Injectable()
export class UsersService {
  constructor(
    @InjectModel(User) private readonly users: typeof User,
    @InjectModel(Membership) private readonly memberships: typeof Membership,
    @Inject(OrganisationsService) private readonly organisations: OrganisationsService,
    @Inject(AuditTrailService) private readonly audit: AuditTrailService,
    @Inject(SessionService) private readonly sessions: SessionService,
    @Inject(ConfigService) private readonly config: ConfigService,
  ) {}

  private get sequelize(): Sequelize {
    return this.users.sequelize as Sequelize;
  }

  get trustIdpRoles(): boolean {
    return section(this.config, 'auth').trustIdpRoles;
  }

  async list(regionId: number, query: ListUsersQuery): Promise<UserListDto> {
    const where: WhereOptions = { regionId };
    if (query.role) Object.assign(where, { role: query.role });
    if (query.status) Object.assign(where, { status: query.status });
    if (query.search) {
      const like = `%${query.search.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
      Object.assign(where, {
        [Op.or]: [{ displayName: { [Op.like]: like } }, { email: { [Op.like]: like } }],
      });
    }
    if (query.practiceId) {
      const ids = (
        await this.memberships.findAll({
          where: { practiceId: query.practiceId },
          attributes: ['userId'],
        })
      ).map((m) => m.userId);
      Object.assign(where, { id: ids });
    }
    const rows = await this.users.findAll({
      where,
      include: [Membership],
      order: [
        ['displayName', 'ASC'],
        ['id', 'ASC'],
      ],
    });
    return { users: await this.toDtos(rows), trustIdpRoles: this.trustIdpRoles };
  }

  /** The views of these people, their practices named by the organisations module. */
  private async toDtos(rows: User[], transaction?: Transaction): Promise<UserDto[]> {
    const practices = new Map(
      (
        await this.organisations.practiceRefs(
          rows.flatMap((u) => (u.memberships ?? []).map((m) => m.practiceId)),
          transaction,
        )
      ).map((p) => [p.id, p]),
    );
    return rows.map((user) => toDto(user, practices));
  }

  async options(regionId: number): Promise<UserOptionsDto> {
    const practices = await this.organisations.regionPractices(regionId);
    return {
      practices: practices.map((p) => ({
        id: p.id,
        code: p.code,
        name: p.name,
        localityName: p.localityName,
      })),
      trustIdpRoles: this.trustIdpRoles,
    };
  }

  async get(regionId: number, userId: number, transaction?: Transaction): Promise<UserDto> {
    const [dto] = await this.toDtos([await this.find(regionId, userId, transaction)], transaction);
    return dto!;
  }

  private async find(regionId: number, userId: number, transaction?: Transaction): Promise<User> {
    const user = await this.users.findOne({
      where: { id: userId, regionId },
      include: [Membership],
      transaction,
    });
    if (!user) {
      throw new ProblemException(
        HttpStatus.NOT_FOUND,
        'user-not-found',
        'No such person',
        `There is no person ${userId} in your region.`,
      );
    }
    return user;
  }

  private async regionPractices(
    regionId: number,
    ids: number[],
    transaction: Transaction,
  ): Promise<PracticeRefDto[]> {
    const unique = [...new Set(ids)];
    const found = unique.length
      ? await this.organisations.regionPractices(regionId, { ids: unique, transaction })
      : [];
    const missing = unique.filter((id) => !found.some((p) => p.id === id));
    if (missing.length) {
      throw new ProblemException(
        HttpStatus.UNPROCESSABLE_ENTITY,
        'unknown-practice',
        'Unknown practice',
        `No practice of your region has the id ${missing.join(', ')}.`,
        { errors: [{ field: 'practiceIds', message: `unknown practice ${missing.join(', ')}` }] },
      );
    }
    return found;
  }

  private entry(c: Actor, user: { id: number }, action: string, summary: string, extra = {}) {
    return {
      action,
      summary,
      actor: { id: c.id, label: c.label },
      regionId: c.regionId,
      subjectType: 'user',
      subjectId: user.id,
      requestId: c.requestId,
      ipAddress: c.ipAddress,
      ...extra,
    };
  }

  async create(dto: CreateUserDto, c: Actor): Promise<UserDto> {
    const practiceIds = dto.role === 'practice_lead' ? (dto.practiceIds ?? []) : [];
    if (dto.role !== 'practice_lead' && dto.practiceIds?.length) {
      throw new ProblemException(
        HttpStatus.UNPROCESSABLE_ENTITY,
        'practices-need-practice-lead',
        'Only practice leads have practices',
        `A ${roleLabel(dto.role)} reads every practice of the region; leave practices empty.`,
        { errors: [{ field: 'practiceIds', message: 'only practice leads have practices' }] },
      );
    }
    return this.sequelize.transaction(async (transaction) => {
      const existing = await this.users.findOne({ where: { email: dto.email }, transaction });
      if (existing) {
        throw new ProblemException(
          HttpStatus.CONFLICT,
          'email-taken',
          'Already known to Cairn',
          `${dto.email} already belongs to ${existing.displayName}.`,
          {
            errors: [{ field: 'email', message: 'is already known to Cairn' }],
            userId: existing.id,
          },
        );
      }
      const practices = await this.regionPractices(c.regionId, practiceIds, transaction);
      const user = await this.users.create(
        {
          regionId: c.regionId,
          email: dto.email,
          displayName: dto.displayName,
          role: dto.role,
          status: 'active',
        },
        { transaction },
      );
      for (const practice of practices) {
        await this.memberships.create(
          { userId: user.id, practiceId: practice.id, role: 'practice_lead' },
          { transaction },
        );
      }
      await this.audit.append(
        this.entry(
          c,
          user,
          'user.created',
          `${c.displayName} added ${dto.displayName} (${dto.email}) as ${roleLabel(dto.role)}${
            practices.length ? ` of ${practices.map((p) => p.code).join(', ')}` : ''
          }`,
          { detail: { role: dto.role, practiceCodes: practices.map((p) => p.code) } },
        ),
        transaction,
      );
      return this.get(c.regionId, user.id, transaction);
    });
  }

  private assertNotSelf(c: Actor, userId: number, what: string) {
    if (c.id === userId) {
      throw new ProblemException(
        HttpStatus.CONFLICT,
        'own-account',
        'Not on your own account',
        `You cannot ${what} yourself; ask another regional lead.`,
      );
    }
  }

  async update(userId: number, dto: UpdateUserDto, c: Actor): Promise<UserDto> {
    return this.sequelize.transaction(async (transaction) => {
      const user = await this.find(c.regionId, userId, transaction);
      if (dto.displayName !== undefined && dto.displayName !== user.displayName) {
        const from = user.displayName;
        await user.update({ displayName: dto.displayName }, { transaction });
        await this.audit.append(
          this.entry(
            c,
            user,
            'user.renamed',
            `${c.displayName} renamed ${from} to ${dto.displayName}`,
            {
              detail: { from, to: dto.displayName },
            },
          ),
          transaction,
        );
      }
      if (dto.role !== undefined && dto.role !== user.role) {
        this.assertNotSelf(c, userId, 'change the role of');
        const from = user.role;
        const removed = from === 'practice_lead' ? (user.memberships ?? []) : [];
        const removedRefs = await this.organisations.practiceRefs(
          removed.map((m) => m.practiceId),
          transaction,
        );
        for (const membership of removed) await membership.destroy({ transaction });
        await user.update({ role: dto.role }, { transaction });
        await this.audit.append(
          this.entry(
            c,
            user,
            'user.role_changed',
            `${c.displayName} changed ${user.displayName}'s role from ${roleLabel(from)} to ${roleLabel(dto.role)}${
              removed.length
                ? `; their practices (${removedRefs.map((p) => p.code).join(', ')}) were removed`
                : ''
            }`,
            {
              detail: { from, to: dto.role, removedPracticeIds: removed.map((m) => m.practiceId) },
            },
          ),
          transaction,
        );
      }
      return this.get(c.regionId, userId, transaction);
    });
  }

  async assignPractice(userId: number, practiceId: number, c: Actor): Promise<UserDto> {
    return this.sequelize.transaction(async (transaction) => {
      const user = await this.find(c.regionId, userId, transaction);
      if (user.role !== 'practice_lead') {
        throw new ProblemException(
          HttpStatus.CONFLICT,
          'not-a-practice-lead',
          'Only practice leads have practices',
          `${user.displayName} is ${roleLabel(user.role) === 'auditor' ? 'an' : 'a'} ${roleLabel(user.role)} and already reads every practice. Make them a practice lead first.`,
        );
      }
      const [practice] = await this.regionPractices(c.regionId, [practiceId], transaction);
      if (!(user.memberships ?? []).some((m) => m.practiceId === practiceId)) {
        await this.memberships.create(
          { userId, practiceId, role: 'practice_lead' },
          { transaction },
        );
        await this.audit.append(
          this.entry(
            c,
            user,
            'membership.added',
            `${c.displayName} made ${user.displayName} a lead of ${practice!.name} (${practice!.code})`,
            { practiceId },
          ),
          transaction,
        );
      }
      return this.get(c.regionId, userId, transaction);
    });
  }

  async removePractice(userId: number, practiceId: number, c: Actor): Promise<UserDto> {
    return this.sequelize.transaction(async (transaction) => {
      const user = await this.find(c.regionId, userId, transaction);
      const membership = (user.memberships ?? []).find((m) => m.practiceId === practiceId);
      if (!membership) {
        const [named] = await this.organisations.regionPractices(c.regionId, {
          ids: [practiceId],
          transaction,
        });
        throw new ProblemException(
          HttpStatus.NOT_FOUND,
          'membership-not-found',
          'Not one of their practices',
          named
            ? `${user.displayName} does not lead ${named.code} (${named.name}).`
            : `${user.displayName} does not lead the practice this address names.`,
        );
      }
      const [practice] = await this.organisations.practiceRefs([practiceId], transaction);
      await membership.destroy({ transaction });
      await this.audit.append(
        this.entry(
          c,
          user,
          'membership.removed',
          `${c.displayName} removed ${user.displayName} as a lead of ${practice?.name} (${practice?.code})`,
          { practiceId },
        ),
        transaction,
      );
      return this.get(c.regionId, userId, transaction);
    });
  }

  async setStatus(userId: number, status: 'active' | 'deactivated', c: Actor): Promise<UserDto> {
    return this.sequelize.transaction(async (transaction) => {
      const user = await this.find(c.regionId, userId, transaction);
      if (user.status === status) return this.get(c.regionId, userId, transaction);
      if (status === 'deactivated') {
        this.assertNotSelf(c, userId, 'deactivate');
      }
      await user.update({ status }, { transaction });
      const ended =
        status === 'deactivated' ? await this.sessions.endAllFor(userId, transaction) : 0;
      await this.audit.append(
        this.entry(
          c,
          user,
          status === 'deactivated' ? 'user.deactivated' : 'user.reactivated',
          status === 'deactivated'
            ? `${c.displayName} deactivated ${user.displayName}${ended ? ` and ended ${ended} open session${ended === 1 ? '' : 's'}` : ''}`
            : `${c.displayName} reactivated ${user.displayName}`,
          { detail: { endedSessions: ended } },
        ),
        transaction,
      );
      return this.get(c.regionId, userId, transaction);
    });
  }

  /** The active practice leads of these practices, one entry per practice they lead. */
  async practiceLeadsOf(practiceIds: readonly number[]): Promise<PracticeLeadContact[]> {
    if (practiceIds.length === 0) return [];
    const rows = await this.memberships.findAll({
      where: { practiceId: [...new Set(practiceIds)] },
      include: [{ model: User, where: { status: 'active', role: 'practice_lead' } }],
      order: [
        ['practiceId', 'ASC'],
        ['userId', 'ASC'],
      ],
    });
    return rows.map((m) => ({
      userId: m.userId,
      email: m.user!.email,
      displayName: m.user!.displayName,
      practiceId: m.practiceId,
      mailOptOuts: optOutList(m.user!.mailOptOuts),
    }));
  }

  /** The kinds of e-mail this person chose not to receive. */
  async mailOptOuts(userId: number): Promise<string[]> {
    const user = await this.users.findByPk(userId, { attributes: ['id', 'mailOptOuts'] });
    return optOutList(user?.mailOptOuts);
  }

  /**
   * Records the kinds of e-mail the signed-in person does not want (their own profile), with
   * an audit event when it changes; `describe` names the kinds for the event's summary.
   */
  async setMailOptOuts(
    c: Actor,
    kinds: readonly string[],
    describe: (kinds: readonly string[]) => string,
  ): Promise<string[]> {
    return this.sequelize.transaction(async (transaction) => {
      const user = await this.users.findByPk(c.id ?? -1, {
        transaction,
        lock: transaction.LOCK.UPDATE,
      });
      if (!user) {
        throw new ProblemException(
          HttpStatus.NOT_FOUND,
          'user-not-found',
          'No such person',
          'Only a signed-in person can change their mail preferences.',
        );
      }
      const before = optOutList(user.mailOptOuts);
      const after = joinOptOuts(kinds);
      if (after !== joinOptOuts(before)) {
        await user.update({ mailOptOuts: after }, { transaction });
        await this.audit.append(
          this.entry(
            c,
            user,
            'user.mail_preferences_changed',
            after
              ? `${c.displayName} chose not to receive ${describe(optOutList(after))}`
              : `${c.displayName} chose to receive every e-mail Cairn sends them`,
            { detail: { before, after: optOutList(after) } },
          ),
          transaction,
        );
      }
      return optOutList(after);
    });
  }
}

export function joinOptOuts(kinds: readonly string[]): string {
  return [...new Set(kinds)].sort().join(',');
}

function toDto(user: User, practiceRefs: Map<number, PracticeRefDto>): UserDto {
  const practices = (user.memberships ?? [])
    .map((m) => practiceRefs.get(m.practiceId))
    .filter((p): p is PracticeRefDto => p !== undefined)
    .sort((a, b) => a.code.localeCompare(b.code));
  return {
    id: user.id,
    email: user.email,
    displayName: user.displayName,
    role: user.role,
    status: user.status,
    practices,
    lastSignInAt: user.lastSignInAt ? new Date(user.lastSignInAt).toISOString() : null,
    createdAt: new Date(user.get('created_at') as Date).toISOString(),
  };
}
