import { ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3';
import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '@/db';
import { EvidenceAggregate, Feedstock, Photo, Trial, User } from '@/db/models';
import { createLocalStorage, type Storage } from '@/lib/storage';
import { deletePhoto, uploadPhoto } from '@/lib/services/photos';
import { createTrial } from '@/lib/services/trials';
import { startFakeS3 } from '../support/fake-s3';
import { buildFeedstock, buildUser } from '../support/factories';
import { gpsTags, jpegWithGps, pngBomb, smallPng, smallWebp } from '../support/images';

const actorOf = (u: User) => ({ id: u.id, role: u.role, emailVerified: true, createdAt: u.createdAt });

type Backend = { name: string; storage: Storage; keys: () => Promise<string[]>; stop: () => Promise<void> };

async function localBackend(): Promise<Backend> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'trialbed-uploads-'));
  return {
    name: 'local disk',
    storage: createLocalStorage(dir),
    keys: async () => (readdirSync(dir, { recursive: true }) as string[]).filter((f) => /\.(jpg|png|webp)$/.test(f)).map((f) => f.split(path.sep).join('/')),
    stop: async () => rmSync(dir, { recursive: true, force: true }),
  };
}

async function s3Backend(): Promise<Backend> {
  const s3 = await startFakeS3();
  const client = new S3Client({ region: 'us-east-1', endpoint: s3.endpoint, forcePathStyle: true, credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' } });
  return {
    name: 'S3 (fake server)',
    storage: s3.storage,
    keys: async () => ((await client.send(new ListObjectsV2Command({ Bucket: s3.bucket }))).Contents ?? []).map((o) => o.Key!),
    stop: async () => {
      client.destroy();
      await s3.stop();
    },
  };
}

describe.each([
  ['local disk', localBackend],
  ['S3 (fake server)', s3Backend],
])('photo upload through the service, stored on %s', (_name, makeBackend) => {
  let backend: Backend;
  let owner: User;
  let stranger: User;
  let feedstock: Feedstock;
  let trialId: number;

  beforeAll(async () => {
    backend = await makeBackend();
    owner = await buildUser({ role: 'contributor' });
    stranger = await buildUser({ role: 'contributor' });
    feedstock = await buildFeedstock();
    ({ id: trialId } = await createTrial(actorOf(owner), {
      feedstockId: feedstock.id, setting: 'bin', preparation: 'raw', provenance: 'home-grown',
      surfaceArea: { amount: 0.2, unit: 'm2' }, species: 'eisenia-fetida', dose: { amount: 0.5, unit: 'kg' },
      region: 'Test valley', startDate: '2026-10-01',
    }));
  });
  afterAll(async () => {
    await Trial.destroy({ where: { feedstockId: feedstock.id } });
    await feedstock.destroy();
    await User.destroy({ where: { id: [owner.id, stranger.id] } });
    await backend.stop();
  });

  const photoCount = () => Photo.count({ where: { trialId } });

  it('re-encodes a JPEG carrying GPS EXIF into one with no EXIF at all, plus a WebP thumbnail', async () => {
    const input = await jpegWithGps();
    // The input really has a GPS IFD with latitude/longitude (tags 1–4), so the check below means something.
    expect(gpsTags((await sharp(input).metadata()).exif)).toEqual(expect.arrayContaining([1, 2, 3, 4]));
    const dto = await uploadPhoto(actorOf(owner), trialId, input, { caption: 'Day 0' }, backend.storage);
    expect(dto).toMatchObject({ trialId, contentType: 'image/jpeg', width: 64, height: 48, caption: 'Day 0', url: `/api/photos/${dto.id}` });
    const row = (await Photo.findByPk(dto.id))!;
    const full = (await backend.storage.get(row.storageKey))!;
    const thumb = (await backend.storage.get(row.thumbKey))!;
    const fullMeta = await sharp(full.body).metadata();
    expect(fullMeta.format).toBe('jpeg');
    expect(fullMeta.exif).toBeUndefined();
    expect(fullMeta.xmp).toBeUndefined();
    expect(fullMeta.iptc).toBeUndefined();
    expect(full.body.includes(Buffer.from('TestCam'))).toBe(false);
    const thumbMeta = await sharp(thumb.body).metadata();
    expect(thumbMeta.format).toBe('webp');
    expect(thumbMeta.exif).toBeUndefined();
    expect(thumb.contentType).toBe('image/webp');
    // Keys are the server's own, never from the upload.
    expect(row.storageKey).toMatch(/^photos\/\d{4}-\d{2}\/[0-9a-f-]{36}\.jpg$/);
  });

  it('handles a PNG by its content: stored as PNG whatever it was called', async () => {
    // The service never sees a file name or declared type; the route ignores both (a PNG sent as "x.jpg", image/jpeg).
    const dto = await uploadPhoto(actorOf(owner), trialId, await smallPng(), {}, backend.storage);
    expect(dto.contentType).toBe('image/png');
    const row = (await Photo.findByPk(dto.id))!;
    expect(row.storageKey.endsWith('.png')).toBe(true);
    expect((await sharp((await backend.storage.get(row.storageKey))!.body).metadata()).format).toBe('png');
  });

  it('accepts WebP', async () => {
    expect((await uploadPhoto(actorOf(owner), trialId, await smallWebp(), {}, backend.storage)).contentType).toBe('image/webp');
  });

  it('accepts a JPEG with HTML appended only as a clean re-encoded image (the HTML is gone)', async () => {
    const input = Buffer.concat([await jpegWithGps(), Buffer.from('<html><script>alert(1)</script></html>')]);
    const dto = await uploadPhoto(actorOf(owner), trialId, input, {}, backend.storage);
    const stored = (await backend.storage.get((await Photo.findByPk(dto.id))!.storageKey))!.body;
    expect(stored.includes(Buffer.from('<script'))).toBe(false);
    expect((await sharp(stored).metadata()).exif).toBeUndefined();
  });

  it('refuses HTML, SVG, a GIF/JS polyglot and a JPEG header over HTML, storing nothing', async () => {
    const before = { rows: await photoCount(), keys: (await backend.keys()).length };
    const refusals: [string, Buffer, number][] = [
      ['HTML', Buffer.from('<!doctype html><html><body><script>alert(1)</script></body></html>'), 415],
      ['SVG', Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"><rect width="10" height="10"/></svg>'), 415],
      // GIF header that is also JavaScript: GIF is not accepted at all.
      ['GIF/JS polyglot', Buffer.from('GIF89a/*\x01\x00\x01\x00\x00\x00\x00*/=1;alert(1);'), 415],
      // Polyglot as defined here: the header says JPEG, the rest is not a valid JPEG.
      ['JPEG header over HTML', Buffer.concat([Buffer.from([0xff, 0xd8, 0xff, 0xe0]), Buffer.from('<html><script>alert(1)</script></html>'.repeat(10))]), 400],
    ];
    for (const [what, bytes, status] of refusals) {
      await expect(uploadPhoto(actorOf(owner), trialId, bytes, {}, backend.storage), what).rejects.toMatchObject({ status, fieldErrors: { photo: [expect.any(String)] } });
    }
    expect(await photoCount()).toBe(before.rows);
    expect((await backend.keys()).length).toBe(before.keys);
  });

  it('refuses a 12 MB file with 413', async () => {
    const big = Buffer.alloc(12 * 1024 * 1024, 0x20);
    big.set([0xff, 0xd8, 0xff, 0xe0]);
    await expect(uploadPhoto(actorOf(owner), trialId, big, {}, backend.storage)).rejects.toMatchObject({ status: 413 });
  });

  it('refuses a decompression bomb (a 1 kB PNG declaring 20000 × 20000) without decoding it', async () => {
    const bomb = pngBomb();
    expect(bomb.length).toBeLessThan(4096);
    const before = await photoCount();
    await expect(uploadPhoto(actorOf(owner), trialId, bomb, {}, backend.storage)).rejects.toMatchObject({
      status: 400,
      fieldErrors: { photo: [expect.stringContaining('too many pixels')] },
    });
    expect(await photoCount()).toBe(before);
  });

  it('lets only the owner add photos, and refuses a check-in of another trial', async () => {
    const png = await smallPng();
    await expect(uploadPhoto(null, trialId, png, {}, backend.storage)).rejects.toMatchObject({ status: 401 });
    await expect(uploadPhoto(actorOf(stranger), trialId, png, {}, backend.storage)).rejects.toMatchObject({ status: 403 });
    await expect(uploadPhoto(actorOf(owner), trialId, png, { checkInId: 999_999_999 }, backend.storage)).rejects.toMatchObject({ status: 400, fieldErrors: { checkInId: [expect.any(String)] } });
  });

  it('deletes a photo with its files and recomputes', async () => {
    const dto = await uploadPhoto(actorOf(owner), trialId, await smallPng(), {}, backend.storage);
    const row = (await Photo.findByPk(dto.id))!;
    await expect(deletePhoto(actorOf(stranger), dto.id, backend.storage)).rejects.toMatchObject({ status: 403 });
    await deletePhoto(actorOf(owner), dto.id, backend.storage);
    expect(await Photo.findByPk(dto.id)).toBeNull();
    expect(await backend.storage.get(row.storageKey)).toBeNull();
    expect(await backend.storage.get(row.thumbKey)).toBeNull();
    expect(await EvidenceAggregate.count({ where: { feedstockId: feedstock.id } })).toBeGreaterThan(0);
  });
});

describe('storage keys', () => {
  it('are never taken from outside: a driver refuses traversal and odd keys', async () => {
    const dir = mkdtempSync(path.join(os.tmpdir(), 'trialbed-keys-'));
    const storage = createLocalStorage(dir);
    for (const key of ['../etc/passwd', 'photos/../../x.jpg', '/abs.jpg', 'photos/a.html', 'photos/A B.jpg']) {
      await expect(storage.put(key, Buffer.from('x'), 'image/jpeg'), key).rejects.toThrow(/refused storage key/);
    }
    rmSync(dir, { recursive: true, force: true });
  });
});

afterAll(() => sequelize.close());
