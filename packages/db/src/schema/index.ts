export * from './auth';
export * from './rinks';
export * from './customers';
export * from './stations';
export * from './desk';
