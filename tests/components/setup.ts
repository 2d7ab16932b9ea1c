// Runs before every component test file: the msw server that stands in for the API listens for the whole file
// and drops each test's routes after it.
import { afterAll, afterEach, beforeAll } from "vitest";
import { componentServer } from "./testServer";

// Every /api request is answered (the test's route, else the server's not-found answer), so what is left
// unhandled is a request to somewhere other than the API: the client talks only to its own server, so such a
// request is a bug and fails loudly instead of reaching the network or getting an answer no server would give.
beforeAll(() => componentServer.listen({ onUnhandledRequest: "error" }));
afterEach(() => componentServer.resetHandlers());
afterAll(() => componentServer.close());
