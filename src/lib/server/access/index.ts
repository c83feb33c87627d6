/**
 * The access layer: the one place that decides what a viewer may see (visibility.ts, as SQL
 * conditions for repositories) and do (rights.ts, lifecycle.ts), and how a refusal to show
 * something reads (not-found.ts). Routes never decide this themselves.
 */
export { ANONYMOUS, type Viewer } from './viewer';
export {
	catalogueEntries,
	embargoPassed,
	grantInForce,
	organisationsWhere,
	visibleDatasets,
	visibleImports,
	visibleOnMaps
} from './visibility';
export { datasetRights, type DatasetRights, type DatasetState } from './rights';
export {
	PAST,
	TRANSITIONS,
	TRANSITION_NAMES,
	transitionRefusal,
	type TransitionName
} from './lifecycle';
export { NOT_FOUND_MESSAGE, notFound, requireUuid } from './not-found';
export { mayShareWith, ownRegions, visibleRegions } from './regions';
export { SHARING_REFUSALS, embargoDateRefusal, expiryRefusal, shareable } from './sharing';
