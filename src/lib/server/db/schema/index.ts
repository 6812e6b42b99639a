export * from './auth';
export * from './studios';
export * from './security';
export * from './relations';
export * from './setups';
export * from './gear';
export * from './shots';
export * from './workshops';
