/**
 * The actions the audit log records (audit_event.action is free text; this is the list the audit
 * page offers as a filter and the words it shows). Add a new action here when you record it.
 */
export const AUDIT_ACTIONS: Record<string, string> = {
	create: 'created a dataset',
	edit: 'edited a description',
	upload: 'uploaded a file',
	'import-start': 'started an import',
	import: 'imported sites',
	submit: 'submitted for review',
	return: 'returned for changes',
	publish: 'published',
	retire: 'retired',
	version: 'opened a new version',
	delete: 'deleted an unpublished dataset',
	download: 'downloaded sites',
	request: 'asked for access',
	grant: 'granted access',
	decline: 'declined an access request',
	revoke: 'revoked access',
	release: 'released an embargo',
	'audit-export': 'exported the audit log',
	'role-change': 'changed a member’s role',
	suspend: 'suspended an account',
	restore: 'restored an account',
	'region.save': 'saved a map region',
	'region.delete': 'deleted a saved map region'
};

export function auditActionLabel(action: string): string {
	return AUDIT_ACTIONS[action] ?? action;
}
