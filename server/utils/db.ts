import type { Sequelize, Transaction } from 'sequelize'
import { createSequelize } from '../database/connection'
import { initModels } from '../database/models'

let instance: Sequelize | undefined

/** The app's connection, opened on first use (Nitro does not await async plugins). */
export function useDb(): Sequelize {
  if (!instance) {
    instance = createSequelize(useRuntimeConfig().databaseUrl)
    initModels(instance)
  }
  return instance
}

export function inTransaction<T>(work: (t: Transaction) => Promise<T>): Promise<T> {
  return useDb().transaction(work)
}

export async function closeDb() {
  const db = instance
  instance = undefined
  await db?.close()
}
