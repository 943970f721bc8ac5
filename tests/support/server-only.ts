// The 'server-only' marker throws outside a React Server bundle; in tests it is an empty module.
export {};
