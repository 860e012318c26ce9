// Assemble lib/fft/_kernel.wat into lib/fft/_kernel_wasm.ts (the module's bytes
// as base64, so that the library needs no file read or fetch to load it):
//   deno run -A tools/build_kernel.ts
// The assembler is wabt's wat2wasm (npm package wabt, pinned in deno.json);
// test/lib/fft/kernel_test.ts assembles the source again and checks that the
// bytes agree, so a change to the .wat without a rebuild fails the tests.
import { assembleKernel, kernelModuleText } from "./kernel_assembly.ts";

const source = new URL("../lib/fft/_kernel.wat", import.meta.url);
const target = new URL("../lib/fft/_kernel_wasm.ts", import.meta.url);
const bytes = await assembleKernel(await Deno.readTextFile(source));
await Deno.writeTextFile(target, kernelModuleText(bytes));
console.log(`${target.pathname}: ${bytes.length} bytes of WebAssembly`);
