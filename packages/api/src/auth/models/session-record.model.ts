import { Column, DataType, Model, PrimaryKey, Table } from 'sequelize-typescript';

/**
 * One express-session row, written by CairnSessionStore (session-store.ts);
 * this model serves endAllFor only. `userId` is copied from the session so that ending a
 * person's access can end all their sessions at once.
 */
@Table({ tableName: 'sessions' })
export class SessionRecord extends Model {
  @PrimaryKey
  @Column({ type: DataType.STRING(64), allowNull: false })
  declare sid: string;

  @Column({ type: DataType.INTEGER, allowNull: true })
  declare userId: number | null;

  @Column({ type: DataType.DATE(3), allowNull: true })
  declare expires: Date | null;

  @Column({ type: DataType.TEXT('medium'), allowNull: false })
  declare data: string;
}
