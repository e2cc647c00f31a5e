import * as foundation from './0001-foundation'
import * as schedule from './0002-schedule'
import * as diary from './0003-diary'
import * as triageQueue from './0004-triage-queue'
import * as circle from './0005-circle'
import * as labs from './0006-labs'
import * as safety from './0007-safety'
import * as requestIds from './0008-request-ids'
import * as readIndexes from './0009-read-indexes'
import * as sessions from './0010-sessions'
import * as throttle from './0011-throttle'
import * as secondFactor from './0012-second-factor'
import * as auditOutcomes from './0013-audit-outcomes'
import * as visits from './0014-visits'
import * as appointmentCancel from './0015-appointment-cancel'
import * as monitoring from './0016-monitoring'
import * as messages from './0017-messages'
import * as taskRuns from './0018-task-runs'
import * as longText from './0019-long-text'

/**
 * Every migration, in order. Nitro bundles the server, so migrations are listed here
 * rather than found on disk at run time. Add a new file and one line below.
 */
export const migrations = [
  { name: '0001-foundation', ...foundation },
  { name: '0002-schedule', ...schedule },
  { name: '0003-diary', ...diary },
  { name: '0004-triage-queue', ...triageQueue },
  { name: '0005-circle', ...circle },
  { name: '0006-labs', ...labs },
  { name: '0007-safety', ...safety },
  { name: '0008-request-ids', ...requestIds },
  { name: '0009-read-indexes', ...readIndexes },
  { name: '0010-sessions', ...sessions },
  { name: '0011-throttle', ...throttle },
  { name: '0012-second-factor', ...secondFactor },
  { name: '0013-audit-outcomes', ...auditOutcomes },
  { name: '0014-visits', ...visits },
  { name: '0015-appointment-cancel', ...appointmentCancel },
  { name: '0016-monitoring', ...monitoring },
  { name: '0017-messages', ...messages },
  { name: '0018-task-runs', ...taskRuns },
  { name: '0019-long-text', ...longText },
]
