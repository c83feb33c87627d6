/**
 * Invented demo accounts, one per organisation role plus a platform administrator and the owners
 * of the other two demo organisations. Seeded only by `npm start`, `npm run dev` and `npm test`;
 * a production deployment has no default accounts.
 */
export const DEMO_PASSWORD = 'korvald-demo-2026';

export interface DemoPerson {
	name: string;
	email: string;
	platformRole: 'admin' | 'user';
	organisationId?: string;
	role?: 'owner' | 'curator' | 'contributor' | 'viewer';
}

export const people: DemoPerson[] = [
	{
		name: 'Astrid Veum',
		email: 'owner@korvald-survey.example',
		platformRole: 'user',
		organisationId: 'org-korvald-survey',
		role: 'owner'
	},
	{
		name: 'Jonas Brekke',
		email: 'curator@korvald-survey.example',
		platformRole: 'user',
		organisationId: 'org-korvald-survey',
		role: 'curator'
	},
	{
		name: 'Liv Tangen',
		email: 'contributor@korvald-survey.example',
		platformRole: 'user',
		organisationId: 'org-korvald-survey',
		role: 'contributor'
	},
	{
		name: 'Erik Moen',
		email: 'viewer@korvald-survey.example',
		platformRole: 'user',
		organisationId: 'org-korvald-survey',
		role: 'viewer'
	},
	{
		name: 'Petra Lund',
		email: 'owner@lindmark-thermics.example',
		platformRole: 'user',
		organisationId: 'org-lindmark-thermics',
		role: 'owner'
	},
	{
		name: 'Nils Aasen',
		email: 'owner@skarnholt.example',
		platformRole: 'user',
		organisationId: 'org-skarnholt',
		role: 'owner'
	},
	{ name: 'Mira Holt', email: 'admin@thermalith.example', platformRole: 'admin' }
];
