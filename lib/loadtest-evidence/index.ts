export * from './records';
export * from './verdict';
export * from './conditions-form';
export * from './run-notes';
export * from './chart-data';
export * from './compare';
export * from './analyse-upload';
