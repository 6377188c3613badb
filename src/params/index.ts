export * from './units.js';
export * from './screws.js';
export * from './errors.js';
export * from './schema.js';
export * from './design.js';
export * from './jsonSchema.js';
export * from './reference.js';
export * from './yamlInput.js';
