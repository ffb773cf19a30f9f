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
import type { Transaction } from 'sequelize';
import { AuditTrailService } from '../audit-trail/audit-trail.service.js';
import type { CairnConfig } from '../config/config.schema.js';
import { OrganisationsService } from '../organisations/organisations.service.js';
import { ROLES, type Role } from '../users/roles.js';
import { type Account, UserAccounts } from '../users/user-accounts.js';
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
    @Inject(UserAccounts) private readonly accounts: UserAccounts,
    @Inject(OrganisationsService) private readonly organisations: OrganisationsService,
    @Inject(AuditTrailService) private readonly audit: AuditTrailService,
  ) {}

  private get auth(): CairnConfig['auth'] {
    return section(this.configService, 'auth');
  }

  /** Maps the IdP's role values to one Cairn role (the most privileged that matches). */
  roleFrom(values: string[]): Role | null {
    const order: Role[] = ['regional_lead', 'auditor', 'practice_lead'];
    for (const role of order) {
      if (this.auth.roleMapping[role].some((v) => values.includes(v))) return role;
    }
    return null;
  }

  /** Lets the person in (returning their account, practices included) or throws SignInRefused. */
  async complete(identity: SamlIdentity, context: RequestContext): Promise<Account> {
    const email = (identity.email ?? (/@/.test(identity.nameId) ? identity.nameId : ''))
      .trim()
      .toLowerCase();
    if (!email) throw new SignInRefused('missing-email', { subject: identity.nameId });
    const trust = this.auth.trustIdpRoles;

    return this.accounts.transaction(async (transaction) => {
      let user = await this.accounts.findByEmailForUpdate(email, transaction);
      if (user && user.status !== 'active') {
        throw new SignInRefused('deactivated', { email, userId: user.id });
      }
      if (!user && !trust) throw new SignInRefused('unknown-user', { email });

      if (trust) {
        const role = this.roleFrom(identity.roleValues);
        if (!role) throw new SignInRefused('no-role', { email, roleValues: identity.roleValues });
        const regionId =
          user?.regionId ?? (await this.organisations.primaryRegion(transaction))?.id;
        if (!regionId) throw new SignInRefused('no-region', { email });
        let practiceIds: number[] = [];
        if (role === 'practice_lead') {
          const codes = [...new Set(identity.practiceCodes)];
          const found = await this.organisations.practicesByCode(regionId, codes, transaction);
          const unknown = codes.filter((c) => !found.some((p) => p.code === c));
          if (unknown.length)
            throw new SignInRefused('unknown-practice', { email, unknownCodes: unknown });
          if (found.length === 0) throw new SignInRefused('no-practice', { email });
          practiceIds = found.map((p) => p.id);
        }
        const displayName = (identity.displayName ?? email).slice(0, 200);
        if (!user) {
          user = await this.accounts.provision(
            { regionId, email, displayName, role, externalId: identity.nameId },
            transaction,
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
          await this.accounts.setRole(user.id, role, transaction);
          user = { ...user, role };
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

      await this.accounts.recordSignIn(user.id, identity.nameId, transaction);
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
      return (await this.accounts.find(user.id, transaction))!;
    });
  }

  private async syncMemberships(
    user: Account,
    practiceIds: number[],
    context: RequestContext,
    transaction: Transaction,
  ): Promise<void> {
    const currentIds = user.practiceIds;
    const added = practiceIds.filter((id) => !currentIds.includes(id));
    const removed = currentIds.filter((id) => !practiceIds.includes(id));
    if (added.length === 0 && removed.length === 0) return;
    const names = new Map(
      (await this.organisations.practiceRefs([...added, ...removed], transaction)).map((p) => [
        p.id,
        `${p.name} (${p.code})`,
      ]),
    );
    for (const practiceId of added) {
      await this.accounts.addMembership(user.id, practiceId, transaction);
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
    for (const practiceId of removed) {
      await this.accounts.removeMembership(user.id, practiceId, transaction);
      await this.audit.append(
        {
          action: 'membership.removed',
          summary: `${user.displayName} no longer leads ${names.get(practiceId)}, as the identity provider says`,
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
