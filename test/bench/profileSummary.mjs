// Plain-text summaries of a V8 CPU profile (`node --cpu-prof`, or the DevTools protocol's
// Profiler domain) and of a Chromium trace (Trace Event Format, the `traceEvents` array): where
// the time goes, as the top entries by self and inclusive time.
//   node test/bench/profileSummary.mjs FILE.cpuprofile|FILE.json [N]

/** `file:line` of a profile node, the path shortened to its last two parts. */
function placeOf(callFrame) {
  const url = callFrame.url || '';
  const short = url === '' ? '(native)' : url.replace(/\?.*$/, '').split('/').slice(-2).join('/');
  return `${callFrame.functionName || '(anonymous)'} ${short}:${callFrame.lineNumber + 1}`;
}

function topLines(totals, n, unit = 1000) {
  return [...totals]
    .sort((a, b) => b[1] - a[1])
    .slice(0, n)
    .map(([key, us]) => `${(us / unit).toFixed(1).padStart(8)} ms  ${key}`);
}

/** Self and inclusive time per function of a CPU profile, the top `n` of each. */
export function summariseCpuProfile(profile, n = 15) {
  const byId = new Map(profile.nodes.map((node) => [node.id, node]));
  const parent = new Map();
  for (const node of profile.nodes)
    for (const child of node.children ?? []) parent.set(child, node.id);
  const sampled = new Map();
  profile.samples.forEach((id, k) => {
    sampled.set(id, (sampled.get(id) ?? 0) + (profile.timeDeltas[k] ?? 0));
  });
  const self = new Map();
  const inclusive = new Map();
  let total = 0;
  for (const [id, us] of sampled) {
    total += us;
    const key = placeOf(byId.get(id).callFrame);
    self.set(key, (self.get(key) ?? 0) + us);
    const seen = new Set();
    for (let at = id; at !== undefined; at = parent.get(at)) {
      const place = placeOf(byId.get(at).callFrame);
      if (seen.has(place)) continue;
      seen.add(place);
      inclusive.set(place, (inclusive.get(place) ?? 0) + us);
    }
  }
  const idle = self.get('(idle) (native):0') ?? 0;
  return [
    `sampled ${(total / 1000).toFixed(1)} ms, of which idle ${(idle / 1000).toFixed(1)} ms`,
    'self time:',
    ...topLines(self, n),
    'inclusive time:',
    ...topLines(inclusive, n),
  ].join('\n');
}

/** A trace event's name with what distinguishes it (event type, timer, function). */
function eventKey(event) {
  const data = event.args?.data ?? {};
  if (event.name === 'EventDispatch' && data.type) return `EventDispatch ${data.type}`;
  if (event.name === 'FunctionCall' && data.functionName)
    return `FunctionCall ${data.functionName} ${(data.url ?? '').split('/').pop()}:${data.lineNumber ?? ''}`;
  return event.name;
}

/**
 * The renderer main thread of the traced page: the process its last main frame committed in
 * (the browser may run other renderers meanwhile, such as its own WebUI pages).
 */
function pageMainThread(events) {
  const commits = events.filter(
    (e) => e.name === 'FrameCommittedInBrowser' && e.args?.data?.isOutermostMainFrame,
  );
  const started = events.find((e) => e.name === 'TracingStartedInBrowser');
  const pid = commits.at(-1)?.args.data.processId ?? started?.args?.data?.frames?.[0]?.processId;
  return events.find(
    (e) =>
      e.ph === 'M' &&
      e.name === 'thread_name' &&
      e.args?.name === 'CrRendererMain' &&
      (pid === undefined || e.pid === pid),
  );
}

/**
 * The page's main thread in a trace: its tasks (count, total, longest, how many over 50 ms) and
 * the self time of each kind of event inside them.
 */
export function summariseTrace(events, n = 15) {
  const main = pageMainThread(events);
  if (!main) return 'no renderer main thread in the trace';
  const own = events
    .filter((e) => e.pid === main.pid && e.tid === main.tid && e.ph === 'X' && e.dur !== undefined)
    .sort((a, b) => a.ts - b.ts || b.dur - a.dur);
  // Top-level tasks (the `toplevel` category names them ThreadControllerImpl::RunTask).
  const outer = own.some((e) => e.name === 'ThreadControllerImpl::RunTask')
    ? 'ThreadControllerImpl::RunTask'
    : 'RunTask';
  const tasks = own.filter((e) => e.name === outer);
  const long = tasks.filter((t) => t.dur > 50000);
  // Self time: each event's duration less that of the events nested directly in it.
  const self = new Map();
  const stack = [];
  const close = (until) => {
    while (stack.length && stack.at(-1).end <= until) {
      const done = stack.pop();
      self.set(done.key, (self.get(done.key) ?? 0) + done.self);
    }
  };
  for (const e of own) {
    close(e.ts);
    const frame = { key: eventKey(e), end: e.ts + e.dur, self: e.dur };
    if (stack.length) stack.at(-1).self -= e.dur;
    stack.push(frame);
  }
  close(Infinity);
  const span = own.length ? (own.at(-1).ts + own.at(-1).dur - own[0].ts) / 1000 : 0;
  const busy = tasks.reduce((a, t) => a + t.dur, 0) / 1000;
  return [
    `main thread: ${tasks.length} tasks over ${span.toFixed(0)} ms, busy ${busy.toFixed(0)} ms; ` +
      `longest ${(Math.max(0, ...tasks.map((t) => t.dur)) / 1000).toFixed(1)} ms, ${long.length} over 50 ms` +
      (long.length
        ? ` (wall / thread CPU: ${long
            .slice(0, 12)
            .map((t) => `${(t.dur / 1000).toFixed(0)}/${((t.tdur ?? NaN) / 1000).toFixed(0)}`)
            .join(', ')} ms)`
        : ''),
    'self time by event:',
    ...topLines(self, n),
  ].join('\n');
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const { readFileSync } = await import('node:fs');
  const data = JSON.parse(readFileSync(process.argv[2], 'utf8'));
  const n = Number(process.argv[3] ?? 15);
  process.stdout.write(
    (data.nodes ? summariseCpuProfile(data, n) : summariseTrace(data.traceEvents ?? data, n)) +
      '\n',
  );
}
