import { pgEnum } from 'drizzle-orm/pg-core';
// Relative, not $lib: drizzle-kit and the seed load the schema outside SvelteKit.
import { HEAT_FLOW_METHODS } from '../../../sites/methods';

/** How the heat flow was determined (the trade's own categories). */
export const heatFlowMethod = pgEnum('heat_flow_method', HEAT_FLOW_METHODS);
