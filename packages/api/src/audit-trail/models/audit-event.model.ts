import { Column, DataType, Model, Table } from 'sequelize-typescript';

export const AUDIT_OUTCOMES = ['success', 'refused', 'failed'] as const;
export type AuditOutcome = (typeof AUDIT_OUTCOMES)[number];

/**
 * One entry of the audit trail. Append-only: the table has triggers that
 * refuse UPDATE and DELETE, and the service offers only append and read.
 */
@Table({ tableName: 'audit_events', timestamps: false })
export class AuditEvent extends Model {
  declare id: number;

  @Column({ type: DataType.DATE(3), allowNull: false })
  declare occurredAt: Date;

  /** Dotted action name, e.g. "auth.sign_in", "submission.confirmed" */
  @Column({ type: DataType.STRING(64), allowNull: false })
  declare action: string;

  @Column({ type: DataType.ENUM(...AUDIT_OUTCOMES), allowNull: false, defaultValue: 'success' })
  declare outcome: AuditOutcome;

  @Column({ type: DataType.INTEGER, allowNull: true })
  declare actorUserId: number | null;

  /** Who acted, as shown: an e-mail address, or "system" */
  @Column({ type: DataType.STRING(254), allowNull: false })
  declare actorLabel: string;

  @Column({ type: DataType.INTEGER, allowNull: true })
  declare regionId: number | null;

  @Column({ type: DataType.INTEGER, allowNull: true })
  declare practiceId: number | null;

  /** What the action was about, e.g. "user", "submission" */
  @Column({ type: DataType.STRING(32), allowNull: true })
  declare subjectType: string | null;

  @Column({ type: DataType.STRING(64), allowNull: true })
  declare subjectId: string | null;

  /** Plain-language summary shown in the audit trail screen */
  @Column({ type: DataType.STRING(500), allowNull: false })
  declare summary: string;

  @Column({ type: DataType.JSON, allowNull: true })
  declare detail: Record<string, unknown> | null;

  @Column({ type: DataType.STRING(64), allowNull: true })
  declare requestId: string | null;

  @Column({ type: DataType.STRING(64), allowNull: true })
  declare ipAddress: string | null;
}
