export * from './types.js';
export * from './build.js';
export * from './standards.js';
export * from './massProps.js';
export * from './plates.js';
export * from './parts.js';
export * from './joints.js';
export * from './components.js';
