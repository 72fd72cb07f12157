import { foundationRoutes } from './foundation'
import { tablesRoutes } from './tables'
import { fillsRoutes } from './fills'
import { membersRoutes } from './members'
import { billingRoutes } from './billing'
import { reviewRoutes } from './review'
import { readTokenRoutes } from './read-tokens'
import { trustRoutes } from './trust'
import { runsRoutes } from './runs'
import { twoWayRoutes } from './two-way'
import { myWorkRoutes } from './my-work'
import type { RouteExpectation } from './types'

// Each feature adds its own file and spreads it here.
export const ROUTES: Record<string, RouteExpectation> = {
  ...foundationRoutes,
  ...membersRoutes,
  ...billingRoutes,
  ...tablesRoutes,
  ...reviewRoutes,
  ...fillsRoutes,
  ...readTokenRoutes,
  ...trustRoutes,
  ...runsRoutes,
  ...twoWayRoutes,
  ...myWorkRoutes,
}
