// Lets scripts (benchmarks, the job worker) import lib/ modules: "server-only" throws outside a React server
// bundle, so for plain Node it resolves to an empty module.
import { register } from "node:module";

const hook = `export async function resolve(specifier, context, next) {
  if (specifier === "server-only") return { url: "data:text/javascript,export {}", shortCircuit: true };
  return next(specifier, context);
}`;
register(`data:text/javascript,${encodeURIComponent(hook)}`, import.meta.url);
