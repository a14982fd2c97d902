// Public surface of the delivery feature: other features import only from here (eslint.config.js checks it).
// Sending packets to homeowners and the packet list of a job.
export { isPacketInProgress, useJobPackets, type PacketRevision, type PacketStatus } from './api/get-job-packets';
export { FailedDeliveriesCard } from './components/failed-deliveries-card';
export { JobDeliveries } from './components/job-deliveries';
export { SendPacketDialog } from './components/send-packet-dialog';
