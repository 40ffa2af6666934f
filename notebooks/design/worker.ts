// Web worker: runs the route search off the page's thread (the same core function the runner uses,
// on the same specification text, parsed here because a parsed specification holds functions that
// cannot be posted), so moving a slider never waits for a search of 25–120 ms.
import { designRoute } from '../../src/core/index.js';
import { loadDesignSpecText, type LoadedDesignSpec } from '../../src/plan/designSpec.js';
import { designInput, type DesignRequest } from './request.js';

let parsed: { text: string; spec: LoadedDesignSpec } | null = null;

self.onmessage = (e: MessageEvent<DesignRequest>) => {
  const { id, text, file, pass, margin } = e.data;
  try {
    if (parsed?.text !== text) parsed = { text, spec: loadDesignSpecText(text, file) };
    const result = designRoute(designInput(parsed.spec, pass, margin));
    (self as unknown as Worker).postMessage({ id, result });
  } catch (err) {
    (self as unknown as Worker).postMessage({ id, error: { message: (err as Error).message } });
  }
};
