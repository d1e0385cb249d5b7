// Runs React's own server-side reply decoder (what Next calls on a server-action body) on each
// body given on stdin, and prints what became of it. Needs `node --conditions=react-server`.
const server = await import("next/dist/compiled/react-server-dom-webpack/server.node.js");
const { decodeReply } = server.default ?? server;

let input = "";
process.stdin.on("data", (c) => (input += c));
process.stdin.on("end", async () => {
  const bodies = JSON.parse(input);
  const results = [];
  for (const body of bodies) {
    let value = body.text;
    if (body.fields) {
      value = new FormData();
      for (const [k, v] of body.fields) value.append(k, v);
    }
    try {
      const decoded = await Promise.race([
        decodeReply(value, {}, {}),
        new Promise((_, reject) => setTimeout(() => reject(new Error("no answer")), 200)),
      ]);
      results.push(Array.isArray(decoded) ? "arguments" : "not a list");
    } catch (error) {
      results.push(`threw: ${String(error && error.message).slice(0, 80)}`);
    }
  }
  process.stdout.write(JSON.stringify(results));
});
