import type { TestProject } from 'vitest/node'
import { buildOnce } from './build'
import { startApp } from './app'
import { CLUSTER_ENV, onPostgres, startCluster } from './postgres'

declare module 'vitest' {
  export interface ProvidedContext {
    appUrl: string
  }
}

/**
 * API project: build once (each test file starts its own server from the build, with its
 * own database and mail catcher). With TIDEWELL_DB=postgres, also start a throw-away
 * PostgreSQL cluster; each server then gets its own database in it (the workers find it in
 * the environment). Browser project: also start one shared server with the demo clinic and
 * its own mail catcher; each browser test uses its own demo people.
 */
export default async function setup(project: TestProject) {
  await buildOnce()
  const cluster = onPostgres && !process.env[CLUSTER_ENV] ? await startCluster() : undefined
  if (cluster) process.env[CLUSTER_ENV] = cluster.url
  const stopCluster = () => {
    if (!cluster) return
    cluster.stop()
    Reflect.deleteProperty(process.env, CLUSTER_ENV)
  }
  if (project.name !== 'e2e') return stopCluster
  const app = await startApp()
  project.provide('appUrl', app.url)
  return async () => {
    await app.stop()
    stopCluster()
  }
}
