// Starts a worker thread of the recheck command when the command runs from source under tsx (as its
// tests run it): Node 20 does not hand tsx's loader on to worker threads, so it is registered here
// before the command's TypeScript module is loaded. The bundled build needs no such step.
//
// Plain JavaScript on purpose: this file must load before anything can be compiled.
import { workerData } from "node:worker_threads";

const { register } = await import("tsx/esm/api");
register();
await import(workerData.entry);
