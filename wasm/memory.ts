/**
 * Reading and writing the arrays a kernel is handed: the f64 or i32 at place
 * `index` of the array starting at byte `base` (laid out by the loader,
 * src/math/wasm-arena.ts). Shared by every kernel in wasm/ (scripts/build-wasm.mjs
 * compiles each with this file beside it).
 */

@inline export function at(base: usize, index: i32): f64 {
  return load<f64>(base + ((<usize>index) << 3));
}

@inline export function put(base: usize, index: i32, value: f64): void {
  store<f64>(base + ((<usize>index) << 3), value);
}

@inline export function whole(base: usize, index: i32): i32 {
  return load<i32>(base + ((<usize>index) << 2));
}
