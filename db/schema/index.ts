/** Every table of Loftline; drizzle-kit reads this file. */
export * from './auth';
export * from './projects';
export * from './sites';
export * from './plans';
export * from './audit';
export * from './dev-mail';
export * from './flights';
export * from './team-settings';
