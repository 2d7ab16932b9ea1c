// Waiting for a response's buffer to empty before writing more of a long download: resolves on "drain", or on
// "close" when the client went away, and takes both listeners off again so a download written in thousands of
// pieces does not pile listeners on the response.
import type { EventEmitter } from "node:events";

export function drainedOrClosed(res: EventEmitter): Promise<void> {
  return new Promise((resolve) => {
    const done = () => {
      res.off("drain", done);
      res.off("close", done);
      resolve();
    };
    res.once("drain", done);
    res.once("close", done);
  });
}
