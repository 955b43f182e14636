export * from './cidr';
export * from './dhcp';
export * from './addressPlanChecks';
export { PlanningError, isPlanningError } from '../radio/errors';
