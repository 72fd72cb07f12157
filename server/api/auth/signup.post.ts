import { signupSchema } from '#shared/schemas/auth'
import { hashPassword } from '~~/server/lib/password'
import { Membership, Organisation, User } from '~~/server/database/models'
import { freeSlug } from '~~/server/services/organisations'
import { describeMe } from '~~/server/services/me'
import { signupAttemptMail } from '~~/server/services/mail-templates'

const IN_USE = 'This e-mail cannot be used to sign up. If it is yours, sign in instead.'

// Creates an organisation and makes the new person its administrator. An address already registered is refused (and
// its owner told by e-mail); refusals are throttled per client address so the answer cannot be used to list accounts quickly.
export default defineEventHandler(async (event) => {
  const input = await readValidBody(event, signupSchema)
  const ip = clientAddress(event)
  const wait = await signupRetryAfter(ip)
  if (wait > 0) {
    setResponseHeader(event, 'retry-after', wait)
    throw apiError(429, 'rate-limited', `Too many sign-up attempts from this network. Try again in ${Math.ceil(wait / 60)} minute(s).`)
  }
  const passwordHash = await hashPassword(input.password)
  const user = await inTransaction(async (transaction) => {
    if (await User.findOne({ where: { email: input.email }, transaction })) return null
    const user = await User.create({ email: input.email, name: input.name, passwordHash }, { transaction })
    const org = await Organisation.create({ name: input.organisation, slug: await freeSlug(input.organisation, transaction) }, { transaction })
    await Membership.create({ orgId: org.id, userId: user.id, role: 'admin' }, { transaction })
    const actor = { id: user.id, email: user.email }
    await audit(event, { orgId: org.id, action: 'org.create', objectType: 'organisation', objectId: org.id, detail: { name: org.name, slug: org.slug }, actor }, transaction)
    await audit(event, { orgId: org.id, action: 'member.add', objectType: 'user', objectId: user.id, detail: { role: 'admin', via: 'sign-up' }, actor }, transaction)
    return user
  })
  if (!user) {
    await recordSignupRefusal(ip)
    await sendMail(signupAttemptMail(input.email, appLink('/signin'), appLink('/forgot-password')))
      .catch(error => console.error('[signup] notice to the existing account not sent:', error))
    throw apiError(409, 'name-taken', IN_USE)
  }
  await startSession(event, user)
  setResponseStatus(event, 201)
  return describeMe(user)
})
