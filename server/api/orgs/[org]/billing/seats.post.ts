import { seatsSchema } from '#shared/schemas/members'
import { changeSeats } from '~~/server/services/billing'

// Sets the number of purchased seats; the proration is invoiced at once (from the confirmed preview's moment, when given).
export default defineEventHandler(async (event) => {
  const { org } = await requirePermission(event, 'members:manage')
  const { seats, requestKey, prorationDate } = await readValidBody(event, seatsSchema)
  await changeSeats(event, org, seats, requestKey ?? event.context.requestId!, prorationDate)
  return { ok: true }
})
