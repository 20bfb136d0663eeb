// Seamwell's demo scenario: invented organisations and people. Every name and address here
// is made up; the sign-in addresses are public contracts (README, tests, outside checks).

export const demoOrganisations = {
	studio: { name: 'Linden Row Studio', kind: 'studio' },
	otherStudio: { name: 'Harbour Movement', kind: 'studio' },
	clinic: { name: 'Fernbank Pelvic Health', kind: 'clinic' },
	otherClinic: { name: 'Quillfield Physiotherapy', kind: 'clinic' }
} as const;

export type DemoOrganisationKey = keyof typeof demoOrganisations;

export interface DemoPerson {
	email: string;
	name: string;
	roles: Array<{
		organisation: DemoOrganisationKey;
		role: 'instructor' | 'physiotherapist' | 'admin';
	}>;
	/** Set for the people who sign in as clients of a studio. */
	clientOf?: DemoOrganisationKey;
	description: string;
}

export const demoPeople: DemoPerson[] = [
	{
		email: 'admin@studio.example',
		name: 'Maren Okafor',
		roles: [
			{ organisation: 'studio', role: 'admin' },
			{ organisation: 'studio', role: 'instructor' }
		],
		description: 'Linden Row Studio — admin and instructor'
	},
	{
		email: 'instructor@studio.example',
		name: 'Tess Almeida',
		roles: [{ organisation: 'studio', role: 'instructor' }],
		description: 'Linden Row Studio — instructor'
	},
	{
		email: 'instructor2@studio.example',
		name: 'Jonah Whitlock',
		roles: [{ organisation: 'studio', role: 'instructor' }],
		description: 'Linden Row Studio — instructor'
	},
	{
		email: 'instructor@otherstudio.example',
		name: 'Priya Venkatesan',
		roles: [{ organisation: 'otherStudio', role: 'instructor' }],
		description: 'Harbour Movement — instructor'
	},
	{
		email: 'admin@clinic.example',
		name: 'Ruth Castellanos',
		roles: [{ organisation: 'clinic', role: 'admin' }],
		description: 'Fernbank Pelvic Health — admin'
	},
	{
		email: 'physio@clinic.example',
		name: 'Dr Ilse Marchetti',
		roles: [{ organisation: 'clinic', role: 'physiotherapist' }],
		description: 'Fernbank Pelvic Health — physiotherapist'
	},
	{
		email: 'physio@otherclinic.example',
		name: 'Owen Brandt',
		roles: [{ organisation: 'otherClinic', role: 'physiotherapist' }],
		description: 'Quillfield Physiotherapy — physiotherapist'
	},
	{
		email: 'client@client.example',
		name: 'Hana Lindqvist',
		roles: [],
		clientOf: 'studio',
		description: 'client of Linden Row Studio (taught by instructor@studio.example)'
	},
	{
		email: 'client2@client.example',
		name: 'Bea Sorensen',
		roles: [],
		clientOf: 'studio',
		description: 'client of Linden Row Studio'
	}
];
