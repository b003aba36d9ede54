/** Sparkwright's pure core. Import from the sub-folders in app code to keep bundles small. */
export * from './schema';
export * from './measure';
export * from './engine';
