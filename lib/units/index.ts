export * from './constants';
export * from './convert';
export * from './temperature';
export * from './rounding';
export * from './format';
export * from './tyre-size';
export * from './circumference';
