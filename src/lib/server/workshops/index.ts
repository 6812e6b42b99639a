// The workshop services, in one import for pages and routes.
export * from './workshops';
export * from './lessons';
export * from './live-position';
export * from './students';
export * from './seats';
