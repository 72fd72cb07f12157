import { Sequelize } from 'sequelize'
import pg from 'pg'

// NUMERIC and BIGINT stay strings (pg's default): table values never pass through floats.
// A connection that errors (PostgreSQL killed or restarted) is marked invalid by Sequelize and replaced on next use; a
// connect attempt gives up after 10 s, so an unreachable database answers 503 quickly (server/error-handlers/).
export function createSequelize(url: string, poolMax = 10): Sequelize {
  if (!url) throw new Error('No database URL: start through `npm start` (scripts/start.sh) or set NUXT_DATABASE_URL')
  return new Sequelize(url, {
    dialect: 'postgres',
    dialectModule: pg,
    logging: false,
    dialectOptions: { connectionTimeoutMillis: 10_000 },
    pool: { max: poolMax, min: 0, idle: 10_000 },
    define: { underscored: true, timestamps: true },
  })
}
