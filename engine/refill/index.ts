// Refill planning: when to order (or book a pick-up), how much, and one delivery for several tanks.

export { consolidateSite, type SiteOrder, type SiteOrderLine, type SitePlan } from './consolidateSite.js';
export {
  type CivilDay,
  isoDateOf,
  latestOrderFor,
  type OrderCalendar,
  weekdayOf,
} from './deliveryCalendar.js';
export { type OrderQuantity, orderQuantity, type QuantityIssue } from './orderQuantity.js';
export {
  forecastOf,
  mapPlanVolumes,
  ORDER_BY_WINDOW_DAYS,
  type PlanSizing,
  planRefill,
  type RefillInput,
  type RefillPlan,
} from './planRefill.js';
export { daysToThreshold, type ReorderPoint, reorderPoint } from './reorderPoint.js';
export { serviceFactor } from './serviceFactor.js';
export {
  parseRefillSettings,
  type RefillSettings,
  type RefillSettingsInput,
  type RefillThreshold,
  refillSettingsSchema,
} from './settings.js';
