export * from './auth';
export * from './rinks';
export * from './customers';
