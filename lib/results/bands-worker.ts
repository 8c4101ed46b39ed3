// Worker thread (server/results/current.ts): the full results, with the Hill curves'
// bootstrap bands, computed off the request thread. Receives a ResultsInput, answers the
// results' JSON.
import { parentPort } from "node:worker_threads";
import { computeResults, type ResultsInput } from "./compute";

parentPort?.on("message", (input: ResultsInput) => {
  parentPort!.postMessage(JSON.stringify(computeResults(input)));
});
