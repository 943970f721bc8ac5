// Gatewell's import graph, type imports included, read with dpdm (the TypeScript path alias resolved
// through tsconfig.json). Used by scripts/check-boundaries.mjs and the boundary tests.
import path from 'node:path';
import { parseCircular, parseDependencyTree, type DependencyTree } from 'dpdm';

/** The project's own source: everything the app, its scripts and its workers run. */
export const SOURCE_GLOBS = [
  'app/**/*.{ts,tsx}',
  'components/**/*.{ts,tsx}',
  'lib/**/*.{ts,tsx,mjs}',
  'models/**/*.ts',
  'scripts/**/*.{ts,mjs}',
  'proxy.ts',
  'instrumentation.ts',
];

/** File → the project files it imports (relative paths; packages left out). */
export async function readImportGraph(
  root = process.cwd(),
  globs = SOURCE_GLOBS,
): Promise<{ tree: DependencyTree; graph: Map<string, string[]> }> {
  const tree = await parseDependencyTree(globs, {
    cwd: root,
    context: root,
    tsconfig: path.join(root, 'tsconfig.json'),
    transform: false,
    skipDynamicImports: false,
  });
  const graph = new Map<string, string[]>();
  for (const [file, dependencies] of Object.entries(tree)) {
    if (file.includes('node_modules')) continue;
    const local = (dependencies ?? [])
      .map((dependency) => dependency.id)
      .filter((id): id is string => id !== null && !id.includes('node_modules'));
    graph.set(file, local);
  }
  return { tree, graph };
}

/** Every cycle in the graph, each as the list of files that close it. */
export function findCycles(tree: DependencyTree): string[][] {
  const local = Object.fromEntries(Object.entries(tree).filter(([file]) => !file.includes('node_modules')));
  return parseCircular(local, false);
}

/** Modules that hold the database or secrets: whatever reaches them runs on the server only. */
const SERVER_ROOTS = [/^lib\/db\.ts$/, /^lib\/env\.ts$/, /^models\//];
const SERVER_ONLY_IMPORT = /^import 'server-only';$/m;

/**
 * lib/ and models/ modules that reach the database or secrets (themselves or through what they import)
 * but do not start with `import 'server-only'`. Worker-thread entries (.mjs) cannot carry the marker.
 */
export function modulesMissingServerOnly(
  graph: Map<string, string[]>,
  readSource: (file: string) => string,
): string[] {
  const reaches = new Map<string, boolean>();
  const reachesServer = (file: string, seen = new Set<string>()): boolean => {
    const known = reaches.get(file);
    if (known !== undefined) return known;
    if (seen.has(file)) return false;
    seen.add(file);
    const result =
      SERVER_ROOTS.some((root) => root.test(file)) ||
      (graph.get(file) ?? []).some((next) => reachesServer(next, seen));
    reaches.set(file, result);
    return result;
  };
  return [...graph.keys()]
    .filter((file) => /^(lib|models)\/.*\.tsx?$/.test(file))
    .filter((file) => reachesServer(file))
    .filter((file) => !SERVER_ONLY_IMPORT.test(readSource(file)))
    .sort();
}
