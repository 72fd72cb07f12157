import type { Transaction } from 'sequelize'
import { Organisation } from '../database/models'

export function slugify(name: string): string {
  const base = name.normalize('NFKD').replace(/[\u0300-\u036f]/g, '').toLowerCase()
    .replace(/&/g, ' and ').replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 48)
  return base.length >= 2 ? base : `org-${base || 'new'}`
}

/** A free slug: the name's slug, or the same with -2, -3, ... */
export async function freeSlug(name: string, transaction?: Transaction): Promise<string> {
  const base = slugify(name)
  for (let n = 1; ; n++) {
    const slug = n === 1 ? base : `${base}-${n}`
    if (!(await Organisation.findOne({ where: { slug }, transaction }))) return slug
  }
}
