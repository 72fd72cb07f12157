import net from 'node:net'
import { createError } from 'h3'
import pg from 'pg'
import { ConnectionAcquireTimeoutError, DatabaseError, Sequelize, UniqueConstraintError } from 'sequelize'
import { describe, expect, it } from 'vitest'
import { isDatabaseUnavailable } from '~~/server/lib/database-unavailable'

// Which failures mean "PostgreSQL cannot be reached now" (503) and which are ordinary faults (500 or a 4xx).

const closedPort = () => new Promise<number>((resolve) => {
  const server = net.createServer().listen(0, '127.0.0.1', () => {
    const { port } = server.address() as net.AddressInfo
    server.close(() => resolve(port))
  })
})

/** A pg-shaped error with a SQLSTATE (PostgreSQL appendix A). */
const pgError = (code: string, message: string) => Object.assign(new Error(message), { code })
const wrapped = (parent: Error) => new DatabaseError(parent as never)

describe('database unavailable', () => {
  it('a real connection refused by a closed port, as Sequelize throws it and as h3 wraps it', async () => {
    const db = new Sequelize(`postgres://nobody:x@127.0.0.1:${await closedPort()}/none`, { dialect: 'postgres', dialectModule: pg, logging: false })
    const error = await db.authenticate().then(() => null, (e: unknown) => e)
    await db.close()
    expect(isDatabaseUnavailable(error)).toBe(true)
    expect(isDatabaseUnavailable(createError(error as Error))).toBe(true)
  })
  it('a server shutting down, starting up or recovering (57P01, 57P03) and dropped connections', () => {
    expect(isDatabaseUnavailable(wrapped(pgError('57P01', 'terminating connection due to administrator command')))).toBe(true)
    expect(isDatabaseUnavailable(wrapped(pgError('57P03', 'the database system is starting up')))).toBe(true)
    expect(isDatabaseUnavailable(wrapped(pgError('08006', 'connection failure')))).toBe(true)
    expect(isDatabaseUnavailable(wrapped(new Error('Connection terminated unexpectedly')))).toBe(true)
    expect(isDatabaseUnavailable(new ConnectionAcquireTimeoutError(new Error('Operation timeout')))).toBe(true)
  })
  it('ordinary faults are not', () => {
    expect(isDatabaseUnavailable(wrapped(pgError('22P02', 'invalid input syntax for type uuid: "----"')))).toBe(false)
    expect(isDatabaseUnavailable(new UniqueConstraintError({}))).toBe(false)
    expect(isDatabaseUnavailable(new Error('Connection terminated unexpectedly'))).toBe(false) // not the database's (e.g. SMTP)
    expect(isDatabaseUnavailable(Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:25'), { code: 'ECONNREFUSED' }))).toBe(false)
    expect(isDatabaseUnavailable(createError({ statusCode: 404 }))).toBe(false)
    expect(isDatabaseUnavailable(null)).toBe(false)
  })
})
