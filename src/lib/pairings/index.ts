// Pairings, tables and standings for events: pure, no I/O (the server's db modules feed them).
export * from './swiss';
export * from './tables';
export * from './standings';
export * from './csv';
