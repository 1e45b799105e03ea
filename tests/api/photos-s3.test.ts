import sharp from 'sharp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '@/db';
import { Feedstock, Photo, Trial, User } from '@/db/models';
import { uploadPhoto } from '@/lib/services/photos';
import { createTrial } from '@/lib/services/trials';
import { startFakeS3 } from '../support/fake-s3';
import { buildFeedstock, buildUser } from '../support/factories';
import { gpsTags, jpegWithGps } from '../support/images';
import { startNextHandler } from '../support/next-app';

const actorOf = (u: User) => ({ id: u.id, role: u.role, emailVerified: true, createdAt: u.createdAt });
/** GET a binary body as a Buffer. */
const getBinary = (server: Parameters<typeof request>[0], url: string) =>
  request(server)
    .get(url)
    .buffer(true)
    .parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    });

// The app configured for an S3-compatible bucket (STORAGE_DRIVER=s3), against a local fake S3 server.
describe('photos in an S3 bucket, served by the route handler', () => {
  let s3: Awaited<ReturnType<typeof startFakeS3>>;
  let app: Awaited<ReturnType<typeof startNextHandler>>;
  let owner: User;
  let feedstock: Feedstock;
  const saved: Record<string, string | undefined> = {};

  beforeAll(async () => {
    s3 = await startFakeS3();
    for (const [k, v] of Object.entries(s3.env)) {
      saved[k] = process.env[k];
      process.env[k] = v;
    }
    app = await startNextHandler();
    owner = await buildUser({ role: 'contributor' });
    feedstock = await buildFeedstock();
  });
  afterAll(async () => {
    await app?.close();
    await Trial.destroy({ where: { feedstockId: feedstock.id } });
    await feedstock.destroy();
    await owner.destroy();
    for (const [k, v] of Object.entries(saved)) {
      if (v === undefined) delete process.env[k];
      else process.env[k] = v;
    }
    await s3.stop();
    await sequelize.close();
  });

  it('stores an upload in the bucket without metadata and serves it and its thumbnail', async () => {
    const { id: trialId } = await createTrial(actorOf(owner), {
      feedstockId: feedstock.id, setting: 'bed', preparation: 'raw', provenance: 'store-bought',
      surfaceArea: { amount: 1, unit: 'm2' }, species: 'eisenia-andrei', dose: { amount: 2, unit: 'kg' },
      region: 'Test valley', startDate: '2026-10-01',
    });
    const input = await jpegWithGps(200, 150);
    expect(gpsTags((await sharp(input).metadata()).exif).length).toBeGreaterThan(0);
    const dto = await uploadPhoto(actorOf(owner), trialId, input, {}, s3.storage);
    const row = (await Photo.findByPk(dto.id))!;
    expect(await s3.storage.get(row.storageKey)).not.toBeNull();

    const full = await getBinary(app.server, dto.url);
    expect(full.status).toBe(200);
    expect(full.headers['content-type']).toBe('image/jpeg');
    expect(full.headers['x-content-type-options']).toBe('nosniff');
    expect(full.headers['cache-control']).toContain('immutable');
    const meta = await sharp(full.body as Buffer).metadata();
    expect([meta.format, meta.width, meta.height, meta.exif]).toEqual(['jpeg', 200, 150, undefined]);

    const thumb = await getBinary(app.server, dto.thumbUrl);
    expect(thumb.status).toBe(200);
    expect(thumb.headers['content-type']).toBe('image/webp');
    expect((await sharp(thumb.body as Buffer).metadata()).format).toBe('webp');

    // A photo whose object is gone from the bucket is a 404, not a 500.
    await s3.storage.delete(row.thumbKey);
    expect((await request(app.server).get(dto.thumbUrl)).status).toBe(404);
  });
});
