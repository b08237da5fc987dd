// The guardian of a local cluster's runner (scripts/lib/cluster-leftovers.ts, startGuardian).
// A clean stop says "released" on the IPC pipe and the guardian ends. When the runner dies
// instead (SIGKILL, a crash) the kernel closes the pipe and gives the guardian a new parent;
// either sign makes the guardian stop what the runner left running — the same clean-up the
// next start would do, only at once.
import { stopLeftovers, type LeftoverScope } from "../lib/cluster-leftovers";

const scope = JSON.parse(process.env.CLUSTER_GUARDIAN_SCOPE ?? "null") as LeftoverScope | null;
if (!scope || !process.send) {
  console.error("guardian: started without its runner (an IPC channel and CLUSTER_GUARDIAN_SCOPE are needed)");
  process.exit(2);
}
const runner = Number(process.env.CLUSTER_GUARDIAN_RUNNER);
console.log(`${new Date().toISOString()} guarding the cluster in ${scope.dir} for its runner, pid ${runner}`);
let cleaning = false;

function runnerGone(sign: string) {
  if (cleaning || !scope) return;
  cleaning = true;
  clearInterval(watch);
  console.log(`${new Date().toISOString()} the runner (pid ${runner}) is gone (${sign}) without stopping the cluster in ${scope.dir}: stopping what it left running`);
  stopLeftovers(scope).then(
    (report) => {
      console.log(`${new Date().toISOString()} stopped: ${report.stopped.join(", ") || "nothing"}; not ours: ${report.notOurs.join(", ") || "none"}`);
      process.exit(0);
    },
    (err: unknown) => {
      console.error(err);
      process.exit(1);
    },
  );
}

const watch = setInterval(() => {
  if (process.ppid !== runner) runnerGone("new parent");
}, 500);
process.on("message", (m) => {
  if (m === "released") process.exit(0);
});
process.on("disconnect", () => runnerGone("pipe closed"));
if (process.ppid !== runner) runnerGone("gone before the guardian started");
else process.send("watching");
