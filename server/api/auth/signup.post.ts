import { signupSchema } from '../../../shared/schemas/auth'
import { hashPassword } from '../../lib/password'
import { Membership, Organisation, User } from '../../database/models'
import { freeSlug } from '../../services/organisations'
import { describeMe } from '../../services/me'

// Creates an organisation and makes the new person its administrator.
export default defineEventHandler(async (event) => {
  const input = await readValidBody(event, signupSchema)
  const passwordHash = await hashPassword(input.password)
  const user = await inTransaction(async (transaction) => {
    if (await User.findOne({ where: { email: input.email }, transaction })) {
      throw createError({ statusCode: 409, statusMessage: 'This e-mail cannot be used to sign up. If it is yours, sign in instead.' })
    }
    const user = await User.create({ email: input.email, name: input.name, passwordHash }, { transaction })
    const org = await Organisation.create({ name: input.organisation, slug: await freeSlug(input.organisation, transaction) }, { transaction })
    await Membership.create({ orgId: org.id, userId: user.id, role: 'admin' }, { transaction })
    const actor = { id: user.id, email: user.email }
    await audit(event, { orgId: org.id, action: 'org.create', objectType: 'organisation', objectId: org.id, detail: { name: org.name, slug: org.slug }, actor }, transaction)
    await audit(event, { orgId: org.id, action: 'member.add', objectType: 'user', objectId: user.id, detail: { role: 'admin', via: 'sign-up' }, actor }, transaction)
    return user
  })
  await startSession(event, user)
  setResponseStatus(event, 201)
  return describeMe(user)
})
