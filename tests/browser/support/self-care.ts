import { sql } from './signin';

/**
 * A client of Linden Row Studio who signs in herself: 20 weeks after a vaginal birth, cleared
 * at her postnatal check (so the finger-width part of the self-check is offered) and with her
 * intake consent. Invented for the tests.
 */
export async function seedLindenRowClient(
	email: string,
	name: string
): Promise<{ userId: string; clientId: string }> {
	const [user] = (await sql<{ id: string }>(
		`insert into users (email, name) values ($1, $2) returning id`,
		[email, name]
	)) as Array<{ id: string }>;
	const [client] = (await sql<{ id: string }>(
		`insert into clients (organisation_id, user_id, name, email, stage, birth_date, delivery,
			postnatal_check_on, postnatal_cleared, intake_consent_at, intake_consent_method)
		 select id, $1, $2, $3, 'postpartum', (now() - interval '20 weeks')::date, 'vaginal',
			(now() - interval '14 weeks')::date, true, now() - interval '12 weeks', 'in_person'
		 from organisations where name = 'Linden Row Studio' returning id`,
		[user!.id, name, email]
	)) as Array<{ id: string }>;
	return { userId: user!.id, clientId: client!.id };
}

/** The same client with a home practice of three exercises; returns her client id. */
export async function seedSelfCareClient(email: string, name: string): Promise<string> {
	const { clientId } = await seedLindenRowClient(email, name);
	await sql(
		`insert into home_practices (client_id, organisation_id, items)
		 select $1, id, $2::jsonb from organisations where name = 'Linden Row Studio'`,
		[
			clientId,
			JSON.stringify([
				{ exerciseId: 'heel-slides', reps: '8 each side', note: null },
				{ exerciseId: 'bent-knee-fall-outs', reps: '8 each side', note: null },
				{ exerciseId: 'curl-up', reps: '5', note: 'Small lift only.' }
			])
		]
	);
	return clientId;
}
