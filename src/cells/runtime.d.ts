// @observablehq/runtime 6.0.1 ships no type declarations; the kit uses only these two names.
declare module '@observablehq/runtime' {
  export const Runtime: unknown;
  export class RuntimeError extends Error {}
}
