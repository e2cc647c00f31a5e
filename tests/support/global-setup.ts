import type { TestProject } from 'vitest/node'
import { buildOnce } from './build'
import { startApp } from './app'

declare module 'vitest' {
  export interface ProvidedContext {
    appUrl: string
  }
}

/**
 * API project: build once (each test file starts its own server from the build, with its
 * own database and mail catcher). Browser project: also start one shared server with the
 * demo clinic and its own mail catcher; each browser test uses its own demo people.
 */
export default async function setup(project: TestProject) {
  await buildOnce()
  if (project.name !== 'e2e') return
  const app = await startApp()
  project.provide('appUrl', app.url)
  return () => app.stop()
}
