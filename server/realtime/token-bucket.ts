// A token bucket on the injected clock (tests move it by hand): it holds up to `burst` tokens and
// gains `perSecond` a second; each message (or resume) takes one.
export interface TokenBucket {
  tokens: number;
  at: number;
}

export interface BucketSize {
  burst: number;
  perSecond: number;
}

export const fullBucket = (size: BucketSize, now: number): TokenBucket => ({ tokens: size.burst, at: now });

function refill(bucket: TokenBucket, size: BucketSize, now: number) {
  bucket.tokens = Math.min(size.burst, bucket.tokens + (Math.max(0, now - bucket.at) * size.perSecond) / 1000);
  bucket.at = Math.max(bucket.at, now);
}

/** Takes a token; false when the bucket is empty. */
export function takeToken(bucket: TokenBucket, size: BucketSize, now: number): boolean {
  refill(bucket, size, now);
  if (bucket.tokens < 1) return false;
  bucket.tokens -= 1;
  return true;
}

/** Whether a token could be taken now (without taking it). */
export function hasToken(bucket: TokenBucket, size: BucketSize, now: number): boolean {
  refill(bucket, size, now);
  return bucket.tokens >= 1;
}

/** Full again: a bucket kept per key can be forgotten, a new one would be the same. */
export function isFull(bucket: TokenBucket, size: BucketSize, now: number): boolean {
  refill(bucket, size, now);
  return bucket.tokens >= size.burst;
}
