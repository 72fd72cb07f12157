// A read token as the administrator sees it (never the token itself, which is shown once when created).
export interface ReadTokenDto {
  id: string
  name: string
  /** the first and last characters, to tell tokens apart */
  hint: string
  createdBy: string | null
  createdAt: string
  lastUsedAt: string | null
  revokedAt: string | null
  /** The tables it may read, or null for every table with a signed-off version. */
  tables: { id: string, name: string }[] | null
}

/** A signed-off table as a production system lists it. */
export interface ReadTableSummaryDto {
  id: string
  name: string
  kind: string
  axis: string
  axisUnit: string
  valueUnit: string
  signedOff: { number: number, contentHash: string, approvedAt: string | null, filled: boolean }
}
