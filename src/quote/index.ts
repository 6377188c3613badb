export * from './offset.js';
export * from './cutData.js';
export * from './nest.js';
export * from './time.js';
export * from './quote.js';
export * from './drawing.js';
export * from './drawingLayout.js';
export * from './report.js';
