/** `npm run seed`: loads the demo data into the configured database, once. */
import { dataSource } from '../db/data-source.js';
import { seedDemoData } from './demo-data.js';

const messages = {
  loaded: 'demo data loaded',
  'already-loaded': 'demo data was loaded before; left as it is',
  'has-user-data': 'the database already has users; demo data not loaded',
};

await dataSource.initialize();
console.log(messages[await seedDemoData(dataSource)]);
await dataSource.destroy();
