// Runs pending migrations as the schema owner, then (re)grants the app role exactly
// what it may do: no UPDATE or DELETE on audit rows. Never sync(). Then installs the run queue (pg-boss).
import { Umzug, SequelizeStorage } from 'umzug'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { createSequelize } from '../server/database/connection'
import { installQueue } from '../server/lib/work/queue'

const here = path.dirname(fileURLToPath(import.meta.url))

export async function migrate(ownerUrl: string, appRole: string | undefined, log = true) {
  const sequelize = createSequelize(ownerUrl, 2)
  try {
    const umzug = new Umzug({
      migrations: { glob: ['server/database/migrations/*.ts', { cwd: path.resolve(here, '..') }] },
      context: sequelize.getQueryInterface(),
      storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
      logger: log ? { info: (m: Record<string, unknown>) => m.event === 'migrated' && console.log(`[migrate] ${m.name}`), warn: console.warn, error: console.error, debug: () => {} } : undefined,
    })
    await umzug.up()
    if (appRole) {
      await sequelize.query(`
        GRANT USAGE ON SCHEMA public TO ${appRole};
        GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA public TO ${appRole};
        GRANT USAGE, SELECT ON ALL SEQUENCES IN SCHEMA public TO ${appRole};
        REVOKE UPDATE, DELETE, TRUNCATE ON audit_events, audit_checkpoints FROM ${appRole};
        REVOKE INSERT, UPDATE, DELETE, TRUNCATE ON schema_migrations FROM ${appRole};
      `)
    }
  } finally {
    await sequelize.close()
  }
  // the run queue (pg-boss's own schema and migrations), after our tables
  await installQueue(ownerUrl, appRole)
}

if (process.argv[1] && fileURLToPath(import.meta.url) === path.resolve(process.argv[1])) {
  const url = process.env.KW_DATABASE_OWNER_URL
  if (!url) { console.error('KW_DATABASE_OWNER_URL is not set (scripts/start.sh sets it)'); process.exit(1) }
  migrate(url, process.env.KW_PG_APP).catch((e) => { console.error(e); process.exit(1) })
}
