export * from './common';
export * from './device';
export * from './power-source';
export * from './battery';
export * from './site';
export * from './validate';
