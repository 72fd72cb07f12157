import { signOut } from '~~/server/services/auth'

// Ends this session on the server and deletes the cookie.
export default defineEventHandler(async (event) => {
  await signOut(event)
  return { ok: true }
})
