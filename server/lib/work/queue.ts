import PgBoss from 'pg-boss'

// The one pg-boss queue of Knotwork's runs. Its schema is installed by the owner role (scripts/migrate.ts); app nodes
// connect as the app role with migrate off, so they never need CREATE rights.
export const WORK_QUEUE = 'knotwork-runs'
export const BOSS_SCHEMA = 'pgboss'

/** Installs or upgrades pg-boss's schema and creates the queue (idempotent), then grants the app role what it uses. */
export async function installQueue(ownerUrl: string, appRole: string | undefined): Promise<void> {
  const boss = new PgBoss({ connectionString: ownerUrl, schema: BOSS_SCHEMA, migrate: true, supervise: false, schedule: false, max: 2 })
  boss.on('error', error => console.error('[queue]', error))
  await boss.start()
  try {
    if (!(await boss.getQueue(WORK_QUEUE))) await boss.createQueue(WORK_QUEUE, { name: WORK_QUEUE, policy: 'standard' })
    if (appRole) {
      const db = boss.getDb()
      await db.executeSql(`
        GRANT USAGE ON SCHEMA ${BOSS_SCHEMA} TO ${appRole};
        GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA ${BOSS_SCHEMA} TO ${appRole};
        GRANT EXECUTE ON ALL FUNCTIONS IN SCHEMA ${BOSS_SCHEMA} TO ${appRole};`, [])
    }
  }
  finally {
    await boss.stop({ graceful: false, wait: true })
  }
}
