// Preloaded (NODE_OPTIONS=--require) by test/e2e/prefault.test.ts: reports on standard error, at exit,
// the worker threads the run started and how many buffers and bytes it posted to each.
const threads = require("node:worker_threads");
const Base = threads.Worker;
const started = [];
threads.Worker = class extends Base {
  constructor(url, options) {
    super(url, options);
    this.log = { name: String(url).split("/").pop(), buffers: 0, bytes: 0 };
    started.push(this.log);
  }
  postMessage(message, transfer) {
    if (message instanceof SharedArrayBuffer) {
      this.log.buffers += 1;
      this.log.bytes += message.byteLength;
    }
    return super.postMessage(message, transfer);
  }
};
process.on("exit", () => {
  for (const log of started) process.stderr.write(`worker ${log.name}: ${log.buffers} buffers, ${log.bytes} bytes\n`);
});
