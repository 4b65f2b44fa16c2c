// Starts every local fake for hosted services and prints one line, `FAKES_READY {json}`, with
// their addresses, so the start and test scripts can hand them to the app. Object storage is
// faked only when the settings choose S3 without naming a real endpoint (HB_STORAGE=s3).
import path from "node:path";
import { startFakeGitHub } from "./github";
import { startFakeS3 } from "./s3";

const port = (name: string, fallback: number) => Number(process.env[name] ?? fallback);

const github = await startFakeGitHub(port("FAKE_GITHUB_PORT", 0));
const s3 =
  process.env.HB_STORAGE === "s3" && !process.env.HB_S3_ENDPOINT
    ? await startFakeS3({ port: port("FAKE_S3_PORT", 0), directory: path.resolve(process.env.HB_DATA_DIR ?? ".data", "fake-s3") })
    : null;
console.log(`FAKES_READY ${JSON.stringify({ FAKE_GITHUB_URL: github.url, ...(s3 ? { HB_STORAGE: "s3", ...s3.settings } : {}) })}`);

const stop = async () => {
  github.close();
  await s3?.close();
  process.exit(0);
};
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
