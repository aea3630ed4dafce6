// Sends one e-mail. The job id names the event it reports, so a retried or re-queued job for the
// same event is one message; SMTP failures are retried with the queue's backoff.
import type { Job } from 'bullmq';
import { sendMail } from '../../server/lib/mailer';
import type { Payload } from '../queues';

export async function mailJob(job: Job<Payload<'mail'>>): Promise<{ to: string }> {
  await sendMail(job.data);
  await job.updateProgress(100);
  return { to: job.data.to };
}
