export * from './lines';
export * from './approval';
export * from './deadline';
export * from './info-request';
export * from './dealer-history';
export { DEFAULT_APPEAL_DAYS, appealWindowEnd } from './appeal';
export * from './log';
