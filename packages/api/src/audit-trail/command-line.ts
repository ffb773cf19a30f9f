/**
 * The audit trail for code that runs without the Nest container (the operator
 * commands and the demo seeding of cli.ts): the same append-only row as
 * AuditTrailService.append, written in the caller's transaction.
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';

export interface CommandLineAuditEntry {
  action: string;
  summary: string;
  /** Who acted: "operator", "system" */
  actorLabel: string;
  regionId: number;
  subjectType: string;
  subjectId: number;
}

export async function appendCommandLineEvent(
  sequelize: Sequelize,
  entry: CommandLineAuditEntry,
  transaction: Transaction,
): Promise<void> {
  await sequelize.query(
    "INSERT INTO audit_events (occurred_at, action, outcome, actor_label, region_id, subject_type, subject_id, summary) VALUES (NOW(3), ?, 'success', ?, ?, ?, ?, ?)",
    {
      replacements: [
        entry.action,
        entry.actorLabel,
        entry.regionId,
        entry.subjectType,
        String(entry.subjectId),
        entry.summary.slice(0, 500),
      ],
      type: QueryTypes.INSERT,
      transaction,
    },
  );
}
