// Worker-thread entry: lets Node load the TypeScript worker through tsx (works under tsx and vitest alike).
import { register } from "tsx/esm/api";

register();
await import("./answerWorker.ts");
