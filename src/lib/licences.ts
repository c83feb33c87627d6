/** Licences a dataset may carry: SPDX identifiers (spdx.org/licenses), plus 'proprietary'. */
export const LICENCES = [
	{ id: 'CC-BY-4.0', name: 'Creative Commons Attribution 4.0' },
	{ id: 'CC-BY-SA-4.0', name: 'Creative Commons Attribution Share-Alike 4.0' },
	{ id: 'CC-BY-NC-4.0', name: 'Creative Commons Attribution Non-Commercial 4.0' },
	{ id: 'CC0-1.0', name: 'Creative Commons Zero 1.0 (public domain dedication)' },
	{ id: 'ODbL-1.0', name: 'Open Data Commons Open Database License 1.0' },
	{ id: 'ODC-By-1.0', name: 'Open Data Commons Attribution License 1.0' },
	{ id: 'PDDL-1.0', name: 'Open Data Commons Public Domain Dedication and License 1.0' },
	{ id: 'OGL-UK-3.0', name: 'Open Government Licence v3.0' },
	{ id: 'proprietary', name: 'Proprietary (terms in the citation or attachments)' }
] as const;

export type LicenceId = (typeof LICENCES)[number]['id'];
export const LICENCE_IDS = LICENCES.map((l) => l.id) as [LicenceId, ...LicenceId[]];
