import { permissionsOf } from '#shared/permissions'

export default defineEventHandler(async (event) => {
  const { org, role } = await requireMember(event)
  return { id: org.id, slug: org.slug, name: org.name, role, permissions: permissionsOf(role) }
})
