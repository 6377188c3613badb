export * from './errors.js';
export * from './changes.js';
export * from './layoutScale.js';
export * from './armModel.js';
export * from './motor.js';
export * from './stiffness.js';
export * from './body.js';
export * from './variant.js';
