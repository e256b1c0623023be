/** The theme: tokens re-exported from one place. */
export * from './tokens';
