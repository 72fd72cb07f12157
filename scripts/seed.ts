// Seeds the invented demo scenario (docs/domain.md#demo) into an EMPTY database only.
import { createSequelize } from '../server/database/connection'
import { seedPeople, DEMO_PASSWORD } from './seed/people'
import { seedTables } from './seed/tables'
import { seedSelectTable } from './seed/select-table'
import { seedBilling } from './seed/billing'
import { seedApprovals } from './seed/approvals'

const url = process.env.KW_DATABASE_OWNER_URL
if (!url) { console.error('KW_DATABASE_OWNER_URL is not set (scripts/start.sh sets it)'); process.exit(1) }
const db = createSequelize(url, 2)
try {
  const [[{ n }]] = await db.query('SELECT count(*)::int AS n FROM organisations') as [[{ n: number }], unknown]
  if (n > 0) {
    console.log('[seed] the database already has data: demo seed skipped')
  } else {
    const people = await db.transaction(async (t) => {
      const people = await seedPeople(db, t)
      await seedTables(db, t, people)
      await seedSelectTable(db, t, people)
      await seedApprovals(db, t, people)
      await seedBilling(db, t, people)
      return people
    })
    console.log('[seed] demo scenario seeded (invented data). Sign in at http://127.0.0.1:3000 with:')
    for (const p of people.list) console.log(`  ${p.email.padEnd(34)} ${p.roles.join(', ')}`)
    console.log(`  password for every demo person: ${DEMO_PASSWORD}`)
  }
} finally {
  await db.close()
}
