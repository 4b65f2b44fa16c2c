// Starts every local fake for hosted services and prints one line, `FAKES_READY {json}`, with
// their addresses, so the start and test scripts can hand them to the app.
import { startFakeGitHub } from "./github";

const port = (name: string, fallback: number) => Number(process.env[name] ?? fallback);

const github = await startFakeGitHub(port("FAKE_GITHUB_PORT", 0));
console.log(`FAKES_READY ${JSON.stringify({ FAKE_GITHUB_URL: github.url })}`);

const stop = () => {
  github.close();
  process.exit(0);
};
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
