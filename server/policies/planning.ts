import type { Actor } from './actor';

export const mayPlan = (a: Actor) => a.role === 'admin' || a.role === 'operator';
