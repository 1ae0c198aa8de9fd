// Stands in for the `server-only` package under vitest, which runs everything as server code.
export {};
