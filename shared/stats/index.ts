export * from './quantile';
export * from './histogram';
