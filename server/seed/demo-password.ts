/**
 * The demo team's shared password. Server-side only: it is printed at start-up and written in the README, and never
 * shipped in the web bundle (a public build must not carry a working password).
 */
export const demoPassword = 'loftline-demo';
