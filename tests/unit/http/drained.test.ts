import { EventEmitter } from "node:events";
import { describe, expect, it } from "vitest";
import { drainedOrClosed } from "../../../server/http/drained";

describe("drainedOrClosed", () => {
  it("resolves on drain and leaves no listener behind, however often it is asked", async () => {
    const res = new EventEmitter();
    for (let i = 0; i < 50; i++) {
      const waiting = drainedOrClosed(res);
      res.emit("drain");
      await waiting;
    }
    expect(res.listenerCount("drain")).toBe(0);
    expect(res.listenerCount("close")).toBe(0);
  });

  it("resolves when the client goes away before the buffer empties", async () => {
    const res = new EventEmitter();
    const waiting = drainedOrClosed(res);
    res.emit("close");
    await expect(waiting).resolves.toBeUndefined();
    expect(res.listenerCount("drain")).toBe(0);
  });
});
