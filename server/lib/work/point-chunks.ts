/** Points as the INSERT takes them: x and y as comma-joined decimal text, at most CHUNK_POINTS per statement. */
export interface PointChunk { xs: string, ys: string, count: number }

export const CHUNK_POINTS = 10_000

/** Joined in the worker thread, so the request's thread only passes finished strings to PostgreSQL. */
export function chunkPoints(points: { x: string, y: string }[]): PointChunk[] {
  const chunks: PointChunk[] = []
  for (let i = 0; i < points.length; i += CHUNK_POINTS) {
    const slice = points.slice(i, i + CHUNK_POINTS)
    chunks.push({ xs: slice.map(p => p.x).join(','), ys: slice.map(p => p.y).join(','), count: slice.length })
  }
  return chunks
}
