import type { VersionDto } from '#shared/types/tables'

/** The refs a draft editor keeps about saving under the optimistic lock. */
export interface LockState { lockVersion: Ref<number>, conflict: Ref<boolean>, failure: Ref<string | null>, saved: Ref<string | null>, saving: Ref<boolean> }

/** PUTs a draft's points or cells (through the app's API client) under its lock; a 409 draft-conflict sets `conflict`, what is on screen is kept. */
export async function putUnderLock(api: ReturnType<typeof useApi>, url: string, body: object, s: LockState): Promise<VersionDto | null> {
  s.saving.value = true
  try {
    const v = await api<VersionDto>(url, { method: 'PUT', body })
    s.lockVersion.value = v.lockVersion
    s.saved.value = `Saved at ${new Date().toLocaleTimeString('en-GB')}.`
    return v
  } catch (e) {
    s.conflict.value = apiErrorCode(e) === 'draft-conflict'
    s.failure.value = apiErrorMessage(e)
    return null
  } finally { s.saving.value = false }
}
