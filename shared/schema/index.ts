export * from './procedure';
export * from './branches';
export * from './upgrade';
export * from './error';
export * from './api';
