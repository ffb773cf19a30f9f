import { QueryTypes, type Sequelize } from 'sequelize';

/** The server's version and how far the migrations got (for health). */
export async function schemaStatus(
  sequelize: Sequelize,
): Promise<{ server: string | undefined; schema: string | null | undefined }> {
  const [row] = await sequelize.query<{ version: string; migration: string | null }>(
    'SELECT VERSION() AS version, (SELECT MAX(name) FROM schema_migrations) AS migration',
    { type: QueryTypes.SELECT },
  );
  return { server: row?.version, schema: row?.migration };
}
