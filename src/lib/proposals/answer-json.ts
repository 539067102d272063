/**
 * The JSON text of an assessment answer (pure), written as UTF-8 pieces instead of one
 * JSON.stringify of the whole: a 2,000-parcel answer is about 20 MB, and one string of that size
 * costs as much again to check and encode when it becomes a response body. The estimates of
 * parcels of one kind share their frozen factors and cautions arrays (carbon/estimate.ts,
 * estimateBatch), so each shared array is encoded once and its bytes reused. The text parses to
 * the same value as JSON.stringify's (only the order of the answer's keys differs: `parcels` last).
 */
import type { Room } from '../http/text-stream';

type Answer = { parcels: Record<string, unknown>[] } & Record<string, unknown>;

/** Pieces of at least this many bytes (the last one excepted). */
const PIECE_BYTES = 256 * 1024;

const isShared = (v: unknown): v is object => typeof v === 'object' && v !== null && Object.isFrozen(v);

/** The text written so far as UTF-8 in one buffer, handed out in pieces without copying. */
class Pieces {
  private text = '';
  private buf: Buffer;
  private at = 0;
  private readonly shared = new Map<object, Buffer>();

  constructor(private readonly pieceBytes: number) {
    this.buf = Buffer.allocUnsafe(pieceBytes * 2);
  }

  write(text: string): void {
    this.text += text;
  }

  /** A frozen value (shared by many parcels): its JSON encoded once. */
  writeShared(value: object): void {
    let b = this.shared.get(value);
    if (!b) this.shared.set(value, (b = Buffer.from(JSON.stringify(value))));
    this.flushText();
    this.room(b.length);
    this.at += b.copy(this.buf, this.at);
  }

  /** `"key":value` for each key of an object whose value JSON writes (undefined and functions are left out, as JSON.stringify does). */
  writeMembers(o: Record<string, unknown>, skip: string | null, first: boolean): boolean {
    for (const k in o) {
      if (!Object.hasOwn(o, k) || k === skip) continue;
      const v = o[k];
      if (isShared(v)) {
        this.write(`${first ? '' : ','}${JSON.stringify(k)}:`);
        this.writeShared(v);
      } else {
        const t = JSON.stringify(v);
        if (t === undefined) continue;
        this.write(`${first ? '' : ','}${JSON.stringify(k)}:${t}`);
      }
      first = false;
    }
    return first;
  }

  /** Room for `bytes` more (a UTF-16 code unit takes at most 3 bytes of UTF-8). */
  private room(bytes: number): void {
    if (this.at + bytes <= this.buf.length) return;
    const bigger = Buffer.allocUnsafe(Math.max(this.buf.length * 2, this.at + bytes));
    this.buf.copy(bigger, 0, 0, this.at);
    this.buf = bigger;
  }

  private flushText(): void {
    if (!this.text) return;
    this.room(this.text.length * 3);
    this.at += this.buf.write(this.text, this.at);
    this.text = '';
  }

  /** The bytes written since the last take, once there are at least `min` of them (all with min 0). */
  take(min: number): Uint8Array | null {
    if (this.at + this.text.length < min) return null;
    this.flushText();
    const out = this.buf.subarray(0, this.at);
    this.buf = Buffer.allocUnsafe(this.pieceBytes * 2);
    this.at = 0;
    return out;
  }
}

function writeParcel(out: Pieces, parcel: Record<string, unknown>): void {
  out.write('{');
  const first = out.writeMembers(parcel, 'estimate', true);
  if (!('estimate' in parcel) || parcel.estimate === undefined) return out.write('}');
  out.write(`${first ? '' : ','}"estimate":`);
  const e = parcel.estimate as Record<string, unknown> | null;
  if (e === null) return out.write('null}');
  out.write('{');
  out.writeMembers(e, null, true);
  out.write('}}');
}

/** The answer's JSON text as UTF-8 pieces of about 256 kB, each made when it is asked for. */
export function* assessmentAnswerPieces(answer: Answer, pieceBytes = PIECE_BYTES): Generator<Uint8Array> {
  const out = new Pieces(pieceBytes);
  out.write('{');
  const first = out.writeMembers(answer, 'parcels', true);
  out.write(`${first ? '' : ','}"parcels":[`);
  for (let i = 0; i < answer.parcels.length; i++) {
    if (i > 0) out.write(',');
    writeParcel(out, answer.parcels[i]!);
    const piece = out.take(pieceBytes);
    if (piece) yield piece;
  }
  out.write(']}');
  yield out.take(0)!;
}

/** The answer's whole JSON text (for callers that need a string). */
export function assessmentAnswerJson(answer: Answer): string {
  return Buffer.concat([...assessmentAnswerPieces(answer)]).toString('utf8');
}

/**
 * A response body of the answer's JSON, made piece by piece as it is read; with `room` (locals.room), each
 * piece waits until the client's connection has room for it.
 */
export function assessmentAnswerBody(answer: Answer, room?: Room): ReadableStream<Uint8Array> {
  const pieces = assessmentAnswerPieces(answer);
  return new ReadableStream({
    async pull(controller) {
      await room?.();
      const next = pieces.next();
      if (next.done) controller.close();
      else controller.enqueue(next.value);
    },
    cancel() {
      pieces.return(undefined);
    },
  });
}
