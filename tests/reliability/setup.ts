import type { TestProject } from 'vitest/node'
import { startStack, stopStack, type StackInfo } from './stack'

// vitest globalSetup of the reliability project: one cluster and one app server for the whole suite (its files run one
// after another), stopped and removed at the end.
declare module 'vitest' {
  export interface ProvidedContext { reliability: StackInfo }
}

export async function setup(project: TestProject) {
  const info = await startStack()
  project.provide('reliability', info)
  return () => stopStack(info)
}
