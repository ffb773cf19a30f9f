// Stand-in for @nestjs/throttler under Jest only (see cjs-package-to-esm.js): the
// transformer replaces this file's content with an ES module build of the package.
export {};
