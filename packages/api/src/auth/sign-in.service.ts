/**
 * Who a valid assertion lets in, and on what terms (auth.trustIdpRoles):
 *
 *  false (default): only people Cairn already knows (by e-mail) and who are
 *    active; their role and practices are Cairn's own. Unknown → refused.
 *  true: the identity provider's role and practice attributes win. Unknown
 *    people are provisioned on first sign-in; known people have their role
 *    and practices brought into line at every sign-in (each change audited).
 *    Deactivation in Cairn still wins: a deactivated person is refused.
 *
 * Every outcome is in the audit trail. A refused sign-in changes nothing:
 * provisioning, the sign-in record and its audit events are one transaction.
 */
import { Inject, Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectModel } from '@nestjs/sequelize';
import { Op } from 'sequelize';
import type { Sequelize } from 'sequelize-typescript';
import { AuditTrailService } from '../audit-trail/audit-trail.service.js';
import type { CairnConfig } from '../config/config.schema.js';
import { Practice } from '../organisations/models/practice.model.js';
import { Region } from '../organisations/models/region.model.js';
import { Membership } from '../users/models/membership.model.js';
import { User } from '../users/models/user.model.js';
import { ROLES, type Role } from '../users/roles.js';
import type { SamlIdentity } from './saml/saml.strategy.js';
import { REFUSAL_REASONS, SignInRefused } from './sign-in-refusal.js';
import { section } from './config-section.js';

export interface RequestContext {
  requestId: string | null;
  ipAddress: string | null;
}

const IDP_ACTOR = 'identity provider';

@Injectable()
export class SignInService {
  constructor(
    @Inject(ConfigService) private readonly configService: ConfigService,
    @InjectModel(User) private readonly users: typeof User,
    @InjectModel(Membership) private readonly memberships: typeof Membership,
    @InjectModel(Practice) private readonly practices: typeof Practice,
    @InjectModel(Region) private readonly regions: typeof Region,
    @Inject(AuditTrailService) private readonly audit: AuditTrailService,
  ) {}

  private get auth(): CairnConfig['auth'] {
    return section(this.configService, 'auth');
  }

  private get sequelize(): Sequelize {
    return this.users.sequelize as Sequelize;
  }

  /** Maps the IdP's role values to one Cairn role (the most privileged that matches). */
  roleFrom(values: string[]): Role | null {
    const order: Role[] = ['regional_lead', 'auditor', 'practice_lead'];
    for (const role of order) {
      if (this.auth.roleMapping[role].some((v) => values.includes(v))) return role;
    }
    return null;
  }

  /** Lets the person in (returning their user row, memberships loaded) or throws SignInRefused. */
  async complete(identity: SamlIdentity, context: RequestContext): Promise<User> {
    const email = (identity.email ?? (/@/.test(identity.nameId) ? identity.nameId : ''))
      .trim()
      .toLowerCase();
    if (!email) throw new SignInRefused('missing-email', { subject: identity.nameId });
    const trust = this.auth.trustIdpRoles;

    return this.sequelize.transaction(async (transaction) => {
      let user = await this.users.findOne({
        where: { email },
        include: [Membership],
        transaction,
        lock: transaction.LOCK.UPDATE,
      });
      if (user && user.status !== 'active') {
        throw new SignInRefused('deactivated', { email, userId: user.id });
      }
      if (!user && !trust) throw new SignInRefused('unknown-user', { email });

      if (trust) {
        const role = this.roleFrom(identity.roleValues);
        if (!role) throw new SignInRefused('no-role', { email, roleValues: identity.roleValues });
        const regionId =
          user?.regionId ??
          (await this.regions.findOne({ order: [['id', 'ASC']], transaction }))?.id;
        if (!regionId) throw new SignInRefused('no-region', { email });
        let practiceIds: number[] = [];
        if (role === 'practice_lead') {
          const codes = [...new Set(identity.practiceCodes)];
          const found = await this.practices.findAll({
            where: { regionId, code: { [Op.in]: codes } },
            transaction,
          });
          const unknown = codes.filter((c) => !found.some((p) => p.code === c));
          if (unknown.length)
            throw new SignInRefused('unknown-practice', { email, unknownCodes: unknown });
          if (found.length === 0) throw new SignInRefused('no-practice', { email });
          practiceIds = found.map((p) => p.id);
        }
        const displayName = (identity.displayName ?? email).slice(0, 200);
        if (!user) {
          user = await this.users.create(
            { regionId, email, displayName, role, status: 'active', externalId: identity.nameId },
            { transaction },
          );
          await this.audit.append(
            {
              action: 'user.provisioned',
              summary: `${displayName} (${email}) added at first sign-in as ${roleLabel(role)}, from the identity provider's attributes`,
              actor: { id: null, label: IDP_ACTOR },
              regionId,
              subjectType: 'user',
              subjectId: user.id,
              detail: { role, practiceCodes: identity.practiceCodes },
              ...context,
            },
            transaction,
          );
        } else if (user.role !== role) {
          const from = user.role;
          await user.update({ role }, { transaction });
          await this.audit.append(
            {
              action: 'user.role_changed',
              summary: `${user.displayName}'s role changed from ${roleLabel(from)} to ${roleLabel(role)} by the identity provider`,
              actor: { id: null, label: IDP_ACTOR },
              regionId,
              subjectType: 'user',
              subjectId: user.id,
              detail: { from, to: role },
              ...context,
            },
            transaction,
          );
        }
        await this.syncMemberships(user, practiceIds, context, transaction);
      }
      if (!user) throw new SignInRefused('unknown-user', { email });

      await user.update(
        { externalId: identity.nameId.slice(0, 255), lastSignInAt: new Date() },
        { transaction },
      );
      await this.audit.append(
        {
          action: 'auth.sign_in',
          summary: `${user.displayName} signed in`,
          actor: { id: user.id, label: user.email },
          regionId: user.regionId,
          subjectType: 'user',
          subjectId: user.id,
          detail: { role: user.role, sessionIndex: identity.sessionIndex, trustIdpRoles: trust },
          ...context,
        },
        transaction,
      );
      const fresh = await this.users.findByPk(user.id, { include: [Membership], transaction });
      return fresh!;
    });
  }

  private async syncMemberships(
    user: User,
    practiceIds: number[],
    context: RequestContext,
    transaction: import('sequelize').Transaction,
  ): Promise<void> {
    const current = await this.memberships.findAll({ where: { userId: user.id }, transaction });
    const currentIds = current.map((m) => m.practiceId);
    const added = practiceIds.filter((id) => !currentIds.includes(id));
    const removed = current.filter((m) => !practiceIds.includes(m.practiceId));
    if (added.length === 0 && removed.length === 0) return;
    const names = new Map(
      (
        await this.practices.findAll({
          where: { id: [...added, ...removed.map((m) => m.practiceId)] },
          transaction,
        })
      ).map((p) => [p.id, `${p.name} (${p.code})`]),
    );
    for (const practiceId of added) {
      await this.memberships.create(
        { userId: user.id, practiceId, role: 'practice_lead' },
        { transaction },
      );
      await this.audit.append(
        {
          action: 'membership.added',
          summary: `${user.displayName} now leads ${names.get(practiceId)}, as the identity provider says`,
          actor: { id: null, label: IDP_ACTOR },
          regionId: user.regionId,
          practiceId,
          subjectType: 'user',
          subjectId: user.id,
          ...context,
        },
        transaction,
      );
    }
    for (const membership of removed) {
      await membership.destroy({ transaction });
      await this.audit.append(
        {
          action: 'membership.removed',
          summary: `${user.displayName} no longer leads ${names.get(membership.practiceId)}, as the identity provider says`,
          actor: { id: null, label: IDP_ACTOR },
          regionId: user.regionId,
          practiceId: membership.practiceId,
          subjectType: 'user',
          subjectId: user.id,
          ...context,
        },
        transaction,
      );
    }
  }

  async recordSignOut(
    user: { id: number; email: string; displayName: string; regionId: number },
    by: 'person' | 'identity provider',
    context: RequestContext,
  ): Promise<void> {
    await this.audit.append({
      action: 'auth.sign_out',
      summary:
        by === 'person'
          ? `${user.displayName} signed out`
          : `${user.displayName} was signed out by the identity provider (single logout)`,
      actor: { id: user.id, label: user.email },
      regionId: user.regionId,
      subjectType: 'user',
      subjectId: user.id,
      detail: { by },
      ...context,
    });
  }

  /** Records a refused sign-in (outside any transaction: nothing else is written). */
  async recordRefusal(
    refusal: SignInRefused,
    context: RequestContext,
    regionId: number | null,
  ): Promise<void> {
    const email = typeof refusal.detail.email === 'string' ? refusal.detail.email : null;
    const userId = typeof refusal.detail.userId === 'number' ? refusal.detail.userId : null;
    await this.audit.append({
      action: 'auth.sign_in_refused',
      outcome: 'refused',
      summary: `Sign-in refused: ${REFUSAL_REASONS[refusal.code]}`,
      actor: { id: userId, label: email ?? 'unidentified' },
      regionId,
      subjectType: userId ? 'user' : null,
      subjectId: userId,
      detail: { reason: refusal.code, ...refusal.detail },
      ...context,
    });
  }
}

export function roleLabel(role: Role): string {
  return { regional_lead: 'regional lead', practice_lead: 'practice lead', auditor: 'auditor' }[
    role
  ];
}

export { ROLES };
