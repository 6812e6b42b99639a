// The setup document and everything around it: schema, migrations, gear specs, API inputs, export file.
export * from './document';
export * from './gear';
export * from './migrations';
export * from './inputs';
export * from './export';
