/** Photo geometry: angles, scale, knee-to-spindle offset, uncertainty, static-vs-dynamic notes. */
export * from './geometry';
export * from './iso5775';
export * from './measure';
export * from './scale';
export * from './schemas';
export * from './static-dynamic';
