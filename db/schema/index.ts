/** Every table of Loftline; drizzle-kit reads this file. */
export * from './auth';
export * from './projects';
export * from './flights';
export * from './team-settings';
