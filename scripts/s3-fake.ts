// Local object-store fake: s3rver on 127.0.0.1, data under .data/s3, with the photo
// bucket created on start and open to browser PUT/GET from local app origins.
// Started detached by scripts/services.sh; stops on SIGTERM.
import S3rver from "s3rver";
import { mkdirSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

const root = fileURLToPath(new URL("..", import.meta.url));
const dataDir = process.env.UNDERTONE_DATA_DIR ?? path.join(root, ".data");
const directory = path.join(dataDir, "s3");
const port = Number(process.env.S3_PORT ?? 4569);
const bucket = process.env.S3_BUCKET ?? "undertone-photos";

// Any origin: this store only listens on loopback and holds local test photos.
const cors = `<CORSConfiguration>
  <CORSRule>
    <AllowedOrigin>*</AllowedOrigin>
    <AllowedMethod>GET</AllowedMethod>
    <AllowedMethod>PUT</AllowedMethod>
    <AllowedMethod>HEAD</AllowedMethod>
    <AllowedHeader>*</AllowedHeader>
    <ExposeHeader>ETag</ExposeHeader>
    <MaxAgeSeconds>3000</MaxAgeSeconds>
  </CORSRule>
</CORSConfiguration>`;

async function main() {
  mkdirSync(directory, { recursive: true });
  const server = new S3rver({
    address: "127.0.0.1",
    port,
    directory,
    silent: true,
    vhostBuckets: false,
    configureBuckets: [{ name: bucket, configs: [cors] }],
  });
  const where = await server.run();
  console.log(`s3 fake listening on http://${where.address}:${where.port}, bucket ${bucket}, data ${directory}`);
  const stop = () => server.close().finally(() => process.exit(0));
  process.on("SIGTERM", stop);
  process.on("SIGINT", stop);
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
