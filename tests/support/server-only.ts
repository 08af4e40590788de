// 'server-only' throws outside a React server bundle; tests run lib/ directly.
export {};
