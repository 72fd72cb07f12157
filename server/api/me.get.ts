import { describeMe } from '../services/me'

export default defineEventHandler(async (event) => {
  const { user } = await requireUser(event)
  return describeMe(user)
})
