/** Test-run set-up shared by every suite: nothing for pure unit runs; API and browser suites start what they need themselves. */
export default function setup(): void {}
