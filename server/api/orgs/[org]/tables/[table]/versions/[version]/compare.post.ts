import { versionParamsSchema } from '#shared/schemas/route-params'
import { compareSchema } from '#shared/schemas/fills'
import { runCompare } from '~~/server/services/fills'

// Fills the version's stored points with every chosen method and sets the results side by side (read-only; any version).
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'fills:run')
  const { table, version } = readValidParams(event, versionParamsSchema)
  const input = await readValidBody(event, compareSchema)
  const res = event.node.res
  return runCompare(access, table, version, input, () => res.destroyed || res.socket?.destroyed === true)
})
