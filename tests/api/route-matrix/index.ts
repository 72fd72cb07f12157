import { foundationRoutes } from './foundation'
import type { RouteExpectation } from './types'

// Each feature adds its own file and spreads it here.
export const ROUTES: Record<string, RouteExpectation> = {
  ...foundationRoutes,
}
