export * from './cidr';
export * from './addressPlanChecks';
export * from './ipv6';
export * from './poolPlan';
export { PlanningError, isPlanningError } from '../radio/errors';
