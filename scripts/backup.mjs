// npm run backup [FOLDER]: a consistent copy of the Tidewell database, taken while the
// server runs, with SQLite's online backup API (node-sqlite3's Database#backup). The copy
// is read inside one read transaction, so it holds every transaction committed before it
// began, including those still in the -wal file that copying the database file alone
// would miss, and none half-written. Writers go on meanwhile (WAL mode).
//
// The copy goes to FOLDER, or TIDEWELL_BACKUP_DIR, or backups/ beside the database
// (data/backups/), as tidewell-YYYYMMDD-HHMMSS.sqlite (UTC): one self-contained file,
// checked with PRAGMA integrity_check before it gets its name.
import { existsSync, mkdirSync, renameSync, rmSync, statSync } from 'node:fs'
import { dirname, join, resolve } from 'node:path'
import sqlite3 from 'sqlite3'

const source = resolve(process.env.NUXT_DATABASE_PATH || 'data/tidewell.sqlite')
const folder = resolve(process.argv[2] || process.env.TIDEWELL_BACKUP_DIR || join(dirname(source), 'backups'))

const open = (file, mode) => new Promise((done, fail) => {
  const db = new sqlite3.Database(file, mode, error => (error ? fail(error) : done(db)))
})
const all = (db, statement) => new Promise((done, fail) => db.all(statement, (error, rows) => (error ? fail(error) : done(rows))))
const close = db => new Promise((done, fail) => db.close(error => (error ? fail(error) : done())))

function stamp(at = new Date()) {
  const pad = n => String(n).padStart(2, '0')
  return `${at.getUTCFullYear()}${pad(at.getUTCMonth() + 1)}${pad(at.getUTCDate())}-${pad(at.getUTCHours())}${pad(at.getUTCMinutes())}${pad(at.getUTCSeconds())}`
}

/** The first free name for this second (a second backup in the same second gets -2). */
function targetName() {
  const base = join(folder, `tidewell-${stamp()}`)
  for (let n = 1; ; n++) {
    const name = n === 1 ? `${base}.sqlite` : `${base}-${n}.sqlite`
    if (!existsSync(name) && !existsSync(`${name}.partial`)) return name
  }
}

/** Copies every page in one step (one read transaction: a consistent snapshot). */
function copyPages(db, file) {
  return new Promise((done, fail) => {
    const backup = db.backup(file, (error) => {
      if (error) return fail(error)
      const step = () => backup.step(-1, (stepError) => {
        if (backup.completed) return backup.finish(() => done(backup.pageCount))
        if (stepError && !backup.failed) return setTimeout(step, 100) // busy or locked: try again
        backup.finish(() => fail(stepError ?? new Error('backup failed')))
      })
      step()
    })
  })
}

if (!existsSync(source)) {
  console.error(`[tidewell] no database at ${source} (NUXT_DATABASE_PATH)`)
  process.exit(1)
}
mkdirSync(folder, { recursive: true })
const target = targetName()
const partial = `${target}.partial`
try {
  const db = await open(source, sqlite3.OPEN_READWRITE)
  let pages
  try {
    pages = await copyPages(db, partial)
  }
  finally {
    await close(db)
  }
  const copy = await open(partial, sqlite3.OPEN_READWRITE)
  try {
    // One file, no -wal beside it, so the copy can be moved or copied like any file.
    await all(copy, 'PRAGMA journal_mode = DELETE')
    const [check] = await all(copy, 'PRAGMA integrity_check')
    if (check?.integrity_check !== 'ok') throw new Error(`integrity check of the copy: ${JSON.stringify(check)}`)
  }
  finally {
    await close(copy)
  }
  renameSync(partial, target)
  const mb = (statSync(target).size / (1024 * 1024)).toFixed(1)
  console.log(`[tidewell] backup written: ${target} (${pages} pages, ${mb} MB, integrity ok)`)
}
catch (error) {
  rmSync(partial, { force: true })
  rmSync(`${partial}-journal`, { force: true })
  console.error(`[tidewell] backup failed: ${error.message}`)
  process.exit(1)
}
