export * from './auth';
export * from './studio';
export * from './lessons';
export * from './recordings';
export * from './publishing';
export * from './billing';
export * from './plan-templates';
export * from './recording-audio';
