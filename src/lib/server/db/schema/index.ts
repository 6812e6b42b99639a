export * from './auth';
export * from './studios';
export * from './security';
export * from './relations';
