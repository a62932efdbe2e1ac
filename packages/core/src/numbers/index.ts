export * from './units';
export * from './hollow';
export * from './level';
export * from './leveling';
export * from './drift';
export * from './wheel';
export * from './queue';
export * from './throughput';
