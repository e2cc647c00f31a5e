// npm run restore FILE: puts a backup (npm run backup) back as the Tidewell database, with
// the server stopped. Refuses while anything has the database open: the server holds it
// open as long as it runs, so an exclusive lock cannot be had. The database it replaces is
// kept beside it as tidewell.sqlite.replaced-YYYYMMDD-HHMMSS (with what its -wal held
// folded in), never deleted. The backup is checked (PRAGMA integrity_check) first.
import { copyFileSync, existsSync, renameSync } from 'node:fs'
import { resolve } from 'node:path'
import sqlite3 from 'sqlite3'

const target = resolve(process.env.NUXT_DATABASE_PATH || 'data/tidewell.sqlite')
const file = process.argv[2] && resolve(process.argv[2])

const open = (path, mode) => new Promise((done, fail) => {
  const db = new sqlite3.Database(path, mode, error => (error ? fail(error) : done(db)))
})
const all = (db, statement) => new Promise((done, fail) => db.all(statement, (error, rows) => (error ? fail(error) : done(rows))))
const exec = (db, statement) => new Promise((done, fail) => db.exec(statement, error => (error ? fail(error) : done())))
const close = db => new Promise((done, fail) => db.close(error => (error ? fail(error) : done())))

function stamp(at = new Date()) {
  const pad = n => String(n).padStart(2, '0')
  return `${at.getUTCFullYear()}${pad(at.getUTCMonth() + 1)}${pad(at.getUTCDate())}-${pad(at.getUTCHours())}${pad(at.getUTCMinutes())}${pad(at.getUTCSeconds())}`
}

function refuse(message) {
  console.error(`[tidewell] restore refused: ${message}`)
  process.exit(1)
}

if (!file) refuse('name the backup file: npm run restore data/backups/tidewell-YYYYMMDD-HHMMSS.sqlite')
if (!existsSync(file)) refuse(`no file ${file}`)
if (file === target) refuse('that is the database itself')

// The backup must be a whole Tidewell database.
{
  const backup = await open(file, sqlite3.OPEN_READONLY).catch(error => refuse(`cannot open ${file}: ${error.message}`))
  try {
    const [check] = await all(backup, 'PRAGMA integrity_check')
    if (check?.integrity_check !== 'ok') refuse(`${file} fails the integrity check: ${JSON.stringify(check)}`)
    const tables = await all(backup, 'SELECT name FROM sqlite_master WHERE type = \'table\' AND name = \'schema_migrations\'')
    if (!tables.length) refuse(`${file} is not a Tidewell database (no schema_migrations table)`)
  }
  catch (error) {
    refuse(`cannot read ${file}: ${error.message}`)
  }
  finally {
    await close(backup)
  }
}

let keptAs = null
if (existsSync(target)) {
  // An exclusive lock on the live database: SQLITE_BUSY while the server (or a backup) has it open.
  const live = await open(target, sqlite3.OPEN_READWRITE).catch(error => refuse(`cannot open ${target}: ${error.message}`))
  try {
    await exec(live, 'PRAGMA locking_mode = EXCLUSIVE; BEGIN EXCLUSIVE; COMMIT')
  }
  catch (error) {
    await close(live)
    if (/SQLITE_BUSY|locked/i.test(error.message)) refuse(`${target} is in use: stop the server first`)
    refuse(`cannot lock ${target}: ${error.message}`)
  }
  // Closing the last connection writes what the -wal holds into the file and removes it.
  await close(live)
  keptAs = `${target}.replaced-${stamp()}`
  renameSync(target, keptAs)
  // Never leave an old -wal, -shm or -journal beside the restored file: SQLite would apply it.
  for (const suffix of ['-wal', '-shm', '-journal']) {
    if (existsSync(`${target}${suffix}`)) renameSync(`${target}${suffix}`, `${keptAs}${suffix}`)
  }
}

const incoming = `${target}.restoring`
copyFileSync(file, incoming)
renameSync(incoming, target)
console.log(`[tidewell] restored ${file} to ${target}${keptAs ? `; the database it replaced is kept as ${keptAs}` : ''}. Start the server.`)
