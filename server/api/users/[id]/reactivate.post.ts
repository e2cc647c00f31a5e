/** An admin switches an account on again; the person signs in with his old password. */
export default defineEventHandler(event => setAccountActive(event, true))
