/**
 * A Map kept once per server process under a global symbol, so that every bundle (and every development
 * reload) that imports the module holding it shares one. No 'server-only': the proxy uses one too.
 */
export function processMap<K, V>(name: string): Map<K, V> {
  const key = Symbol.for(`gatewell.${name}`);
  const store = globalThis as { [key: symbol]: Map<K, V> | undefined };
  return (store[key] ??= new Map<K, V>());
}
