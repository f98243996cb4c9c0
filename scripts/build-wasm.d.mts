// Types of build-wasm.mjs for the test that compiles the kernels again (src/math/wasm-arena.test.ts).
export interface KernelBuild {
  /** AssemblyScript source, relative to the repository. */
  readonly source: string;
  /** Generated TypeScript module, relative to the repository. */
  readonly target: string;
  /** Name of the Uint8Array constant the module exports. */
  readonly constant: string;
  /** WebAssembly features beyond the compiler's defaults that the kernel uses ('simd'). */
  readonly enable?: readonly string[];
}
export const KERNEL_COMPILE_OPTIONS: Readonly<Record<string, unknown>>;
export const KERNELS: readonly KernelBuild[];
/** The WebAssembly bytes of one AssemblyScript source file. */
export function compileKernel(sourcePath: string, enable?: readonly string[]): Promise<Uint8Array>;
/** The generated TypeScript module holding `bytes`. */
export function kernelModuleText(kernel: KernelBuild, bytes: Uint8Array): string;
