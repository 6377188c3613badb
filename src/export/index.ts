export * from './format.js';
export * from './svgPath.js';
export * from './svgPart.js';
export * from './svgOverview.js';
export * from './dxfDocument.js';
export * from './dxf.js';
export * from './hardwareCsv.js';
export * from './svgAssemblyView.js';
