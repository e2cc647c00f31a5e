/** The clinic's regimens (key `regimens`): the regimens page and the staff forms that offer them. */
export function useRegimens() {
  return useFetch('/api/regimens', { key: 'regimens', default: () => [] })
}
