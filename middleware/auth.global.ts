import { can, type Permission } from '#shared/permissions'

// Every page except those marked public needs a signed-in person; pages under
// /orgs/[org] need a membership (404 otherwise) and may name a permission (403).
export default defineNuxtRouteMiddleware(async (to) => {
  // A page the server already answered with its error page (a 404 for another organisation's table): the browser shows
  // that error from the payload. Refusing again while hydrating would raise it during the app's start (a console error).
  if (import.meta.client && useNuxtApp().isHydrating && useError().value) return
  const workspace = useWorkspaceStore()
  if (to.meta.public) return
  const me = await workspace.load()
  if (!me) return navigateTo({ path: '/signin', query: to.fullPath !== '/' ? { next: to.fullPath } : {} })
  const slug = to.params.org as string | undefined
  if (!slug) return
  const role = workspace.roleIn(slug)
  if (!role) return abortNavigation(createError({ statusCode: 404, statusMessage: 'No such organisation.' }))
  const needed = to.meta.permission as Permission | undefined
  if (needed && !can(role, needed)) {
    return abortNavigation(createError({ statusCode: 403, statusMessage: 'Your role does not give access to this page.' }))
  }
})
