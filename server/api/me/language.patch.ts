import { languageSchema } from '#shared/auth/schemas'
import { User } from '../../db/models'

/** Remembers the signed-in user's language (e-mails follow it too). */
export default defineEventHandler(async (event) => {
  const actor = await requireActiveUser(event)
  const { language } = await readValidatedBody(event, parseWith(languageSchema))
  await User.update({ language }, { where: { id: actor.id } })
  const session = await getUserSession(event)
  await setUserSession(event, { user: { ...session.user!, language } })
  return { language }
})
