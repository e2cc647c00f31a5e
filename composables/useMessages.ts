/** The fetch key of one patient's conversations (GET /api/patients/:id/messages), shared by every part that changes them. */
export function messagesKey(patientId: number) {
  return `messages-${patientId}`
}

function unreadKey(userId: number | undefined) {
  return `unread-${userId ?? 0}`
}

/**
 * How many messages the signed-in person has not read (GET /api/me/unread), for the header:
 * fetched with the page and again on each change of route, never on a timer.
 */
export function useUnreadMessages() {
  const { user, loggedIn } = useUserSession()
  const route = useRoute()
  const { data, refresh } = useFetch('/api/me/unread', {
    key: computed(() => unreadKey(user.value?.id)),
    immediate: loggedIn.value,
    default: () => ({ unread: 0 }),
  })
  watch(() => route.path, () => {
    if (loggedIn.value) refresh()
  })
  return computed(() => (loggedIn.value ? data.value?.unread ?? 0 : 0))
}

/** After a thread was read or a message sent: the conversations and the header's count as they are now. */
export function useMessagesRefresh() {
  const { user } = useUserSession()
  return (patientId: number) => refreshNuxtData([messagesKey(patientId), unreadKey(user.value?.id)])
}
