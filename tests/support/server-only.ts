// Stands in for the server-only marker package under Vitest (it throws outside a React server bundle).
export {};
