import * as foundation from './0001-foundation'
import * as schedule from './0002-schedule'
import * as circle from './0005-circle'

/**
 * Every migration, in order. Nitro bundles the server, so migrations are listed here
 * rather than found on disk at run time. Add a new file and one line below.
 */
export const migrations = [
  { name: '0001-foundation', ...foundation },
  { name: '0002-schedule', ...schedule },
  { name: '0005-circle', ...circle },
]
