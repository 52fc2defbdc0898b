// `npm run bench [filter]`: runs every section (or those whose title contains the filter) and prints its rows.
import { formatRow, machineNote } from './harness.js';
import { sections } from './sections/index.js';

const filter = process.argv[2]?.toLowerCase();
console.log(`tank-runway bench on ${machineNote()}`);
for (const section of sections) {
  if (filter && !section.title.toLowerCase().includes(filter)) continue;
  console.log(`\n${section.title}`);
  for (const row of await section.run()) console.log(formatRow(row));
}
