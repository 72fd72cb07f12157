import { can, type Permission } from '#shared/permissions'

/** The organisation in the current route, the caller's role in it, and a permission check. */
export function useOrg() {
  const route = useRoute()
  const workspace = useWorkspaceStore()
  const slug = computed(() => (route.params.org as string | undefined) ?? workspace.firstOrg ?? undefined)
  const membership = computed(() => workspace.me?.memberships.find(m => m.org.slug === slug.value) ?? null)
  const role = computed(() => membership.value?.role ?? null)
  const allowed = (permission: Permission) => can(role.value, permission)
  return { slug, membership, role, allowed }
}
