// A proxy in front (Caddy in docker/compose.yaml) keeps idle connections to the app for 2 minutes
// and sends the next request into one of them. The app must not close them sooner: with Node's
// default of 5 s, a request sent as the app closed its end failed (decision 179).
import { connect, type Socket } from "node:net";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startServer, type TestServer } from "./helpers";

let srv: TestServer;
beforeAll(async () => {
  srv = await startServer();
});
afterAll(() => srv.close());

/** Sends one GET on the socket and resolves with the status of the whole answer that comes back. */
function get(socket: Socket, path: string): Promise<number> {
  return new Promise((resolve, reject) => {
    let buf = "";
    const onData = (d: Buffer) => {
      buf += d.toString("latin1");
      const end = buf.indexOf("\r\n\r\n");
      if (end < 0) return;
      const length = Number(/\r\ncontent-length: *(\d+)/i.exec(buf.slice(0, end))?.[1] ?? 0);
      if (buf.length < end + 4 + length) return;
      socket.off("data", onData);
      resolve(Number(buf.slice(9, 12)));
    };
    socket.on("data", onData);
    socket.once("close", () => reject(new Error("the server closed the connection")));
    socket.write(`GET ${path} HTTP/1.1\r\nHost: 127.0.0.1\r\nConnection: keep-alive\r\n\r\n`);
  });
}

describe("kept-alive connections", () => {
  it("stay open past Node's default 5 s, so a proxy's next request on one is answered", async () => {
    const { port } = new URL(srv.url);
    const socket = connect(Number(port), "127.0.0.1");
    let closedAt = 0;
    socket.on("close", () => (closedAt = Date.now()));
    socket.on("error", () => {});
    const t0 = Date.now();
    expect(await get(socket, "/api/health")).toBe(200);
    await new Promise((r) => setTimeout(r, 6_000));
    expect(closedAt ? `closed by the server after ${closedAt - t0} ms idle` : "open").toBe("open");
    expect(await get(socket, "/api/health")).toBe(200);
    socket.destroy();
  }, 20_000);
});
