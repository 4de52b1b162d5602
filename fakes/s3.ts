/**
 * Local S3-compatible store for development and tests: s3rver (a registry package) on loopback.
 * The app reaches it only through @aws-sdk/client-s3, so a hosted store is a change of S3_* variables.
 * Usage: node --import tsx fakes/s3.ts [--port 4569] [--dir .data/s3] [--bucket lossline-raw]
 */
import { mkdirSync } from 'node:fs';
import { parseArgs } from 'node:util';
import S3rver from 's3rver';

const { values } = parseArgs({
  options: {
    port: { type: 'string', default: process.env.S3_PORT ?? '4569' },
    dir: { type: 'string', default: '.data/s3' },
    bucket: { type: 'string', default: process.env.S3_BUCKET ?? 'lossline-raw' },
  },
});

// Browsers PUT straight into the store with presigned URLs, so the bucket needs CORS.
const cors = `<CORSConfiguration>
  <CORSRule>
    <AllowedOrigin>*</AllowedOrigin>
    <AllowedMethod>GET</AllowedMethod><AllowedMethod>PUT</AllowedMethod><AllowedMethod>POST</AllowedMethod><AllowedMethod>HEAD</AllowedMethod>
    <AllowedHeader>*</AllowedHeader>
    <ExposeHeader>ETag</ExposeHeader>
    <MaxAgeSeconds>3000</MaxAgeSeconds>
  </CORSRule>
</CORSConfiguration>`;

mkdirSync(values.dir!, { recursive: true });
const server = new S3rver({
  address: '127.0.0.1',
  port: Number(values.port),
  directory: values.dir!,
  silent: true,
  configureBuckets: [{ name: values.bucket!, configs: [cors] }],
});
await server.run();
console.log(`[s3] s3rver on http://127.0.0.1:${values.port} bucket ${values.bucket} (files in ${values.dir})`);
const stop = async () => {
  await server.close();
  process.exit(0);
};
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
