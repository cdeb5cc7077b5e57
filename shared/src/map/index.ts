export * from './mapTypes.js';
export { bindingMap } from './bindingMap.js';
export { bindingMapDirect } from './bindingMapDirect.js';
export { axisNodes, mapAxes } from './mapAxes.js';
export type { BindingMapOptions } from './bindingMapOptions.js';
export type { AbortSignalLike } from './abortError.js';
