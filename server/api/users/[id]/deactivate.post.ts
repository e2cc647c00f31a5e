/** An admin switches an account off: its sessions end at once and it can no longer sign in. */
export default defineEventHandler(event => setAccountActive(event, false))
