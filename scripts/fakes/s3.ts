// A local stand-in for S3-compatible object storage: s3rver on 127.0.0.1 with one bucket, its
// objects in a folder of its own. The app talks to it through @aws-sdk/client-s3, the production
// client, with path-style addressing (decision 014).
import S3rver from "s3rver";

export const FAKE_S3_CREDENTIALS = { accessKeyId: "S3RVER", secretAccessKey: "S3RVER" };

export async function startFakeS3(opts: { port?: number; directory: string; bucket?: string }) {
  const bucket = opts.bucket ?? "hiltbench-files";
  const server = new S3rver({ address: "127.0.0.1", port: opts.port ?? 0, silent: true, directory: opts.directory, configureBuckets: [{ name: bucket }] });
  const where = await server.run();
  const url = `http://127.0.0.1:${where.port}`;
  return {
    url,
    bucket,
    settings: { HB_S3_ENDPOINT: url, HB_S3_BUCKET: bucket, HB_S3_ACCESS_KEY_ID: FAKE_S3_CREDENTIALS.accessKeyId, HB_S3_SECRET_ACCESS_KEY: FAKE_S3_CREDENTIALS.secretAccessKey, HB_S3_PATH_STYLE: "true" },
    close: () => server.close(),
  };
}
