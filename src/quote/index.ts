export * from './offset.js';
export * from './cutData.js';
export * from './nest.js';
export * from './time.js';
export * from './quote.js';
