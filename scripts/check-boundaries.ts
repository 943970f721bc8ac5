// Checks the structure the linter cannot see file by file: no import cycle anywhere (type imports
// included), and `import 'server-only'` in every lib/ or models/ module that reaches the database or
// secrets. Usage: npx tsx scripts/check-boundaries.ts (exit 1 on any finding).
import { readFileSync } from 'node:fs';
import { findCycles, modulesMissingServerOnly, readImportGraph } from './import-graph';

async function main(): Promise<number> {
  const { tree, graph } = await readImportGraph();
  const cycles = findCycles(tree);
  const missing = modulesMissingServerOnly(graph, (file) => readFileSync(file, 'utf8'));
  for (const cycle of cycles) console.log(`import cycle: ${[...cycle, cycle[0]].join(' → ')}`);
  for (const file of missing) console.log(`no import 'server-only': ${file}`);
  console.log(
    `${graph.size} files: ${cycles.length} cycle(s), ${missing.length} server module(s) without the marker`,
  );
  return cycles.length + missing.length === 0 ? 0 : 1;
}

main().then((code) => process.exit(code));
