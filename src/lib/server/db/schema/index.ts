export * from './organisations';
export * from './datasets';
export * from './sites';
export * from './sign-in-failures';
export * from './auth';
export * from './site-data';
export * from './files';
export * from './audit';
