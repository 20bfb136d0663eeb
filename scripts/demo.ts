// Demo data from the command line (run with tsx):
//   --if-empty       load the demo scenario when the database has no organisation yet
//   --reset-data     empty the app's tables and load the scenario again (tests)
//   --accounts-json  print the demo sign-in accounts as JSON
import { createDatabase } from '../src/lib/server/db';
import { clearData, isEmpty, seedDemo } from '../src/lib/server/demo/seed';
import { demoPeople } from '../src/lib/server/demo/scenario';

const flag = process.argv[2];

if (flag === '--accounts-json') {
	console.log(JSON.stringify(demoPeople.map(({ email, description }) => ({ email, description }))));
	process.exit(0);
}

// Emptying tables needs the owner role; loading data is ordinary app work.
const url = flag === '--reset-data' ? process.env.DATABASE_OWNER_URL : process.env.DATABASE_URL;
if (!url) {
	console.error('DATABASE_URL / DATABASE_OWNER_URL is not set');
	process.exit(1);
}
const database = createDatabase(url, { max: 2 });
try {
	if (flag === '--if-empty') {
		if (await isEmpty(database)) {
			await seedDemo(database);
			console.log('[seamwell] Loaded the demo scenario.');
		}
	} else if (flag === '--reset-data') {
		await clearData(database);
		await seedDemo(database);
	} else {
		console.error('usage: tsx scripts/demo.ts --if-empty | --reset-data | --accounts-json');
		process.exitCode = 2;
	}
} finally {
	await database.$client.end();
}
