import { seatsPreviewSchema } from '#shared/schemas/members'
import { previewSeats } from '~~/server/services/billing'

// What a change of seats will charge now, from the payment service's preview (nothing changes): shown before confirming.
export default defineEventHandler(async (event) => {
  const { org } = await requirePermission(event, 'members:manage')
  const { seats } = await readValidBody(event, seatsPreviewSchema)
  return previewSeats(event, org, seats)
})
