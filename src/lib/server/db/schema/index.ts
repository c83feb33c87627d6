export * from './organisations';
export * from './datasets';
export * from './sites';
