// A tool's stdout as one end of a local stream socket, the other end read here with `onread`: each
// read lands straight in memory the caller names (e.g. the rest of a raw frame), with no buffer
// allocated per read and no copy in JavaScript. A child's ordinary stdout is read 64 KB at a time
// into a fresh buffer each (decision 148). The socket's name lives only while the two ends connect,
// in a fresh folder only this user can enter, so no other process can take the connection.
import { mkdtemp, rm } from "node:fs/promises";
import net from "node:net";
import os from "node:os";
import path from "node:path";

export interface SocketReads {
  /** Memory for the next read; never empty. */
  buffer: () => Uint8Array;
  /** `n` bytes were read into the start of the last buffer. False pauses reading until `reader.resume()`. */
  callback: (n: number) => boolean;
}

export interface StdoutSocket {
  /** Give this to the child as its stdout, then destroy it here (the child holds its own copy). */
  childEnd: net.Socket;
  /** Ends (`end`/`close`) once every holder of the child's end has closed it. */
  reader: net.Socket;
}

export async function openStdoutSocket(reads: SocketReads): Promise<StdoutSocket> {
  // The OS temp folder rather than a job folder: a socket's name must stay short (≈ 100 bytes).
  const dir = await mkdtemp(path.join(os.tmpdir(), "loadframe-out-"));
  const server = net.createServer({ pauseOnConnect: true });
  let reader: net.Socket | undefined;
  try {
    const name = path.join(dir, "s");
    const accepted = new Promise<net.Socket>((resolve, reject) => {
      server.once("connection", resolve);
      server.once("error", reject);
    });
    await new Promise<void>((resolve, reject) => {
      server.once("error", reject);
      server.listen(name, resolve);
    });
    const client = net.connect({ path: name, onread: reads });
    reader = client;
    const connected = new Promise<void>((resolve, reject) => {
      client.once("connect", resolve);
      client.once("error", reject);
    });
    const [childEnd] = await Promise.all([accepted, connected]);
    return { childEnd, reader: client };
  } catch (err) {
    reader?.destroy();
    throw err;
  } finally {
    server.close();
    await rm(dir, { recursive: true, force: true });
  }
}

/** Raw stdout read straight into the caller's memory (RunOptions.stdoutInto). */
export interface StdoutSink {
  /** Memory the next read goes into (e.g. the rest of the current frame); never empty. */
  next(): Uint8Array;
  /**
   * `n` bytes were read into the start of the last `next()`. A returned promise holds the reading,
   * and so the tool, until it settles; a throw or a rejection stops the run.
   */
  read(n: number): void | Promise<void>;
}

export interface SinkReading {
  childEnd: net.Socket;
  /** Every byte read and every held read settled, or the reader destroyed. */
  done(): Promise<void>;
  /**
   * The tool has exited: stop reading once nothing has come for `ms` while nothing is held (a
   * grandchild that kept the child's end open would otherwise keep the reading from ending).
   */
  endWhenQuiet(ms: number): void;
  destroy(): void;
}

/**
 * Read a tool's stdout into `sink`. `failed` hears of the sink's first failure (or the socket's);
 * from then on the bytes are read to the end and dropped, so the tool is never left blocked.
 */
export async function readStdoutInto(sink: StdoutSink, on: { progress: () => void; failed: (err: unknown) => void }): Promise<SinkReading> {
  let failed = false;
  let scratch: Uint8Array | undefined;
  let held: Promise<void> = Promise.resolve();
  let holding = false;
  let lastRead = Date.now();
  const live: { reader?: net.Socket } = {};
  const fail = (err: unknown) => {
    if (failed) return;
    failed = true;
    on.failed(err);
  };
  const drop = () => (scratch ??= new Uint8Array(64 * 1024));
  // Both run inside Node's read loop, where a throw would end the process: every fault goes to `fail`.
  const buffer = () => {
    if (failed) return drop();
    try {
      const b = sink.next();
      if (b.length > 0) return b;
      fail(new Error("the output's reader gave no memory to read into"));
    } catch (err) {
      fail(err);
    }
    return drop();
  };
  const callback = (n: number) => {
    lastRead = Date.now();
    on.progress();
    if (failed) return true;
    let wait: void | Promise<void>;
    try {
      wait = sink.read(n);
    } catch (err) {
      fail(err);
      return true;
    }
    if (!wait) return true;
    holding = true;
    held = wait.then(undefined, fail).finally(() => {
      holding = false;
      lastRead = Date.now();
      live.reader?.resume();
    });
    return false;
  };
  const socket = await openStdoutSocket({ buffer, callback });
  live.reader = socket.reader;
  let over = false;
  const ended = new Promise<void>((resolve) => {
    const end = () => ((over = true), resolve());
    socket.reader.once("end", end);
    socket.reader.once("close", end);
  });
  socket.reader.on("error", (err) => fail(new Error(`reading the tool's output failed: ${err.message}`)));
  return {
    childEnd: socket.childEnd,
    done: async () => {
      await ended;
      await held;
    },
    endWhenQuiet: (ms) => {
      const check = () => {
        if (over) return;
        if (!holding && Date.now() - lastRead >= ms) socket.reader.destroy();
        else setTimeout(check, ms).unref();
      };
      setTimeout(check, ms).unref();
    },
    destroy: () => socket.reader.destroy(),
  };
}
