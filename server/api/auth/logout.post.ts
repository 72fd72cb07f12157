export default defineEventHandler(async (event) => {
  const session = await getUserSession(event)
  if (session.sid && session.user) {
    await revokeSession(session.sid, 'signed out')
    await audit(event, { action: 'auth.sign-out', objectType: 'session', objectId: session.sid, actor: { id: session.user.id, email: session.user.email } })
  }
  await clearUserSession(event)
  return { ok: true }
})
