/**
 * After a `shutdown` request, the protocol allows only the `exit` notification: every other
 * request is answered with the error InvalidRequest (-32600), and other notifications are
 * ignored. The gate does this for every handler at once, between the transport and the
 * connection: it wraps the message reader, which sees each message in the order the client sent
 * it, and the message writer, so that an error answered by the gate goes out after the answer to
 * the shutdown request itself (responses keep the order of their requests).
 *
 * Handlers in server.ts need not know: none of them runs after a shutdown.
 */
import {
  ErrorCodes,
  Message,
  type DataCallback,
  type Disposable,
  type MessageReader,
  type MessageWriter,
  type NotificationMessage,
  type RequestMessage,
  type ResponseMessage,
} from 'vscode-languageserver/node';

export const AFTER_SHUTDOWN_MESSAGE = 'The server has been shut down: only the exit notification is accepted.';

type Id = RequestMessage['id'];

export class ShutdownGate {
  /** The id of the shutdown request once it has come; undefined before. */
  private shutdownId: Id | undefined = undefined;
  /** Whether the answer to the shutdown request has been written. */
  private shutdownAnswered = false;
  /** Errors waiting for the answer to the shutdown request. */
  private readonly held: ResponseMessage[] = [];
  private out: MessageWriter | null = null;

  /** Whether a shutdown request has come. */
  get shutDown(): boolean {
    return this.shutdownId !== undefined;
  }

  /** The reader the connection listens to: messages after a shutdown request stop here. */
  readerFor(inner: MessageReader): MessageReader {
    return {
      onError: inner.onError,
      onClose: inner.onClose,
      onPartialMessage: inner.onPartialMessage,
      listen: (callback: DataCallback): Disposable => inner.listen((message) => this.pass(message, callback)),
      dispose: () => inner.dispose(),
    };
  }

  /** The writer the connection writes to: errors held for the shutdown answer go out after it. */
  writerFor(inner: MessageWriter): MessageWriter {
    this.out = inner;
    return {
      onError: inner.onError,
      onClose: inner.onClose,
      write: async (message: Message): Promise<void> => {
        await inner.write(message);
        if (!this.shutdownAnswered && this.shutdownId !== undefined && Message.isResponse(message) && message.id === this.shutdownId) {
          this.shutdownAnswered = true;
          for (const error of this.held.splice(0)) await inner.write(error);
        }
      },
      end: () => inner.end(),
      dispose: () => inner.dispose(),
    };
  }

  private pass(message: Message, callback: DataCallback): void {
    if (this.shutdownId === undefined) {
      if (Message.isRequest(message) && message.method === 'shutdown') this.shutdownId = message.id;
      callback(message);
      return;
    }
    // Answers to the server's own requests, and the exit notification, still go through.
    if (Message.isResponse(message) || (Message.isNotification(message) && (message as NotificationMessage).method === 'exit')) {
      callback(message);
      return;
    }
    if (!Message.isRequest(message)) return;
    const error: ResponseMessage = { jsonrpc: '2.0', id: message.id, error: { code: ErrorCodes.InvalidRequest, message: AFTER_SHUTDOWN_MESSAGE } };
    if (this.shutdownAnswered && this.out) void this.out.write(error);
    else this.held.push(error);
  }
}
