import { defineStore } from 'pinia'
import type { MeDto } from '#shared/types/api'
import type { Role } from '#shared/permissions'

// Who is signed in and their organisations: shared by the layout, the guards and every page.
export const useWorkspaceStore = defineStore('workspace', () => {
  const me = ref<MeDto | null>(null)
  const loaded = ref(false)
  const api = useApi()

  async function load(force = false) {
    if (loaded.value && !force) return me.value
    try {
      me.value = await api<MeDto>('/api/me')
    } catch (e) {
      // the database is out of reach for a moment: show that (503), not the sign-in page
      if (apiErrorCode(e) === 'service-unavailable') throw createError({ statusCode: 503, statusMessage: apiErrorMessage(e), fatal: true })
      me.value = null
    }
    loaded.value = true
    return me.value
  }

  function set(value: MeDto | null) {
    me.value = value
    loaded.value = true
  }

  function roleIn(slug: string | undefined): Role | null {
    return me.value?.memberships.find(m => m.org.slug === slug)?.role ?? null
  }

  const firstOrg = computed(() => me.value?.memberships[0]?.org.slug ?? null)

  return { me, loaded, load, set, roleIn, firstOrg }
})
