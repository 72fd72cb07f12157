import type { GraduateResult, GraduationSpec } from '../engine/contract'

export type { GraduateResult, GraduationDiagnostics, GraduationSpec } from '../engine/contract'

/** POST .../graduate: the graduation of the version's given points, beside them, before anything is stored. */
export interface GraduationPreviewDto {
  result: GraduateResult
  crude: { x: string, y: string }[]
  /** Deaths and exposures were known for every point (the import mapped them): the chi-square test applies. */
  withExposures: boolean
  lockVersion: number
  engineMs: number
}

/** How a version was graduated (table_versions.graduation): shown on the table page and the version. */
export interface GraduationRecord {
  fromNumber: number
  spec: GraduationSpec
  rationale: string
  byName: string | null
  at: string
}
