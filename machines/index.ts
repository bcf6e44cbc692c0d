export * from './claim';
