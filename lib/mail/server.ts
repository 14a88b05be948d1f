import 'server-only';

// The entry app code uses: the same functions, marked so they can never reach a client bundle.
// Tests import ./send, ./mailbox and ./links directly, since `server-only` throws outside Next.
export { sendMail, mailConfigFromEnv, closeMailTransports, mailReachable, type OutgoingMail, type SentMail } from './send';
export {
  listMessages,
  getMessage,
  clearMessages,
  waitForMessage,
  mailboxUrl,
  type StoredMessage,
} from './mailbox';
export { extractLinks } from './links';
