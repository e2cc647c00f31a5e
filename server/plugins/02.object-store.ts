import { mkdirSync } from 'node:fs'
import { dirname, join, resolve } from 'node:path'
import S3rver from 's3rver'

/**
 * With no NUXT_S3_ENDPOINT, a local S3-compatible stand-in (s3rver) listens on loopback and
 * keeps attachments in data/objects beside the database, so the demo and the tests go over
 * real HTTP through the same SDK calls a hosted store gets. Nothing leaves the machine. Its
 * port is NUXT_OBJECT_STORE_PORT (0: any free one; only the app talks to it).
 */
export default defineNitroPlugin((nitroApp) => {
  if (!objectStoreStandInEnabled()) return
  const config = useRuntimeConfig()
  const directory = join(dirname(resolve(String(config.databasePath))), 'objects')
  mkdirSync(directory, { recursive: true, mode: 0o700 })
  const server = new S3rver({ address: '127.0.0.1', port: Number(config.objectStorePort), silent: true, directory })
  const running = server.run().then(
    ({ address, port }) => useStandInEndpoint(`http://${address}:${port}`),
    (error: Error) => console.error('[tidewell] object store stand-in', error.message),
  )
  nitroApp.hooks.hook('close', async () => {
    await running
    await server.close()
  })
})
