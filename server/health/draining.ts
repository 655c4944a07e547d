// Set when the process begins a graceful shutdown: /api/ready then answers 503 so a load
// balancer stops sending new requests while the running ones finish.
let draining = false;
export const isDraining = () => draining;
export function startDraining() {
  draining = true;
}
