/** States of a grid job, in order; the `grid_status` enum is made from this list. */
export const GRID_STATUSES = ['queued', 'running', 'done', 'failed'] as const;
export type GridStatus = (typeof GRID_STATUSES)[number];
