export * from './procedure';
export * from './upgrade';
export * from './error';
export * from './api';
