export * from './lines';
export * from './stock';
export * from './dangerous-goods';
export * from './core-clock';
export * from './tracks';
