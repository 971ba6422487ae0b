import { STREAMS, VESSEL_KEY, type Stream } from './schemas';

export type TopicParse =
  | { ok: true; vessel: string; stream: Stream }
  | { ok: false; reason: 'bad_topic' | 'unknown_stream'; vessel?: string; stream?: string };

/** `{root}/{vessel}/{stream}` → its parts; the topic is the only source of identity. */
export function parseTopic(root: string, topic: string): TopicParse {
  const prefix = `${root}/`;
  if (!topic.startsWith(prefix)) return { ok: false, reason: 'bad_topic' };
  const parts = topic.slice(prefix.length).split('/');
  if (parts.length !== 2) return { ok: false, reason: 'bad_topic' };
  const [vessel, stream] = parts as [string, string];
  if (!VESSEL_KEY.test(vessel)) return { ok: false, reason: 'bad_topic', vessel, stream };
  if (!(STREAMS as readonly string[]).includes(stream)) return { ok: false, reason: 'unknown_stream', vessel, stream };
  return { ok: true, vessel, stream: stream as Stream };
}

export function topicFor(root: string, vessel: string, stream: Stream): string {
  return `${root}/${vessel}/${stream}`;
}
