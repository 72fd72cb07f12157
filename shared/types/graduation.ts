import type { GraduateResult, GraduationSpec } from '../engine/contract'

export type { GraduateResult, GraduationDiagnostics, GraduationSpec } from '../engine/contract'

/** POST .../graduate: the graduation of the version's given points, beside them, before anything is stored. */
export interface GraduationPreviewDto {
  result: GraduateResult
  crude: { x: string, y: string }[]
  /** Exposures were imported for the table: they weight the graduation. */
  withExposures: boolean
  /** Deaths and exposures were known for every point: the standardised deviations and the chi-square test apply. */
  withDeaths: boolean
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
