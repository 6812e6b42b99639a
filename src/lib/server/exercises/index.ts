// Exercises and hand-ins (issue 17): setting exercises, starting them, handing in, review and export.
export * from './exercises';
export * from './hand-ins';
export * from './csv';
