// How Fourfold starts Debian's Chromium for the browser tests and the benchmark: headless, no
// sandbox (CI runs as root), and kept off the network (the host resolver maps every name to
// nothing except the local server).
export const CHROMIUM_EXECUTABLE = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--host-resolver-rules=MAP * ~NOTFOUND , EXCLUDE 127.0.0.1 , EXCLUDE localhost',
];
