/**
 * The task pages of Help: one list, used by the Help index and by the screens that link to the
 * page for the task at hand (helpHref), so a renamed page cannot leave a dead link behind.
 */
export const HELP_TOPICS = {
	publish: {
		title: 'Publish a dataset',
		summary:
			'From a draft to a published, citable dataset: review, return, publish, correct, retire.'
	},
	import: {
		title: 'Import a spreadsheet',
		summary: 'Formats, the template, units, coordinate systems and what is checked.'
	},
	'fix-rows': {
		title: 'Fix rows an import refuses',
		summary: 'What blocks a row, what only warns, and how to correct or leave out rows.'
	},
	roles: {
		title: 'Roles and what each may do',
		summary: 'Owner, curator, contributor and viewer in an organisation.'
	},
	visibility: {
		title: 'Visibility, embargoes and access',
		summary: 'Public, embargoed, restricted and private datasets; asking for and granting access.'
	},
	citing: {
		title: 'Cite and download data',
		summary: 'How to cite a dataset, what a download carries, and the licences.'
	},
	models: {
		title: 'The models and their limits',
		summary: 'What the geotherms and heat-flow grids assume, and when not to rely on them.'
	}
} as const;

export type HelpTopic = keyof typeof HELP_TOPICS;

export const helpHref = (topic: HelpTopic) => `/help/${topic}`;
