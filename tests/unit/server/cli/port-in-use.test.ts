import { describe, expect, it } from 'vitest';
import { portInUseMessage } from '../../../../server/cli/lib/port-in-use.ts';

const config = { port: 3000, mailCatcherPort: 2525, payments: { fakePort: 0 } };
/** The shape Node's net.Server gives a listen error (code, syscall, address, port). */
const busy = (port: number) =>
  Object.assign(new Error(`listen EADDRINUSE: address already in use 127.0.0.1:${port}`), {
    code: 'EADDRINUSE',
    syscall: 'listen',
    address: '127.0.0.1',
    port,
  });

describe('portInUseMessage: a busy port at start-up is one sentence naming the variable to change', () => {
  it('names MAIL_CATCHER_PORT for the mail catcher and PORT for the web server', () => {
    expect(portInUseMessage(busy(2525), config)).toBe(
      'Port 2525 is already in use: stop the program using it, or set MAIL_CATCHER_PORT to a free port (e.g. MAIL_CATCHER_PORT=2526 npm start).',
    );
    expect(portInUseMessage(busy(3000), config)).toMatch(/^Port 3000 is already in use: .* set PORT to a free port/);
  });

  it('names both variables when the port is neither, and leaves other errors alone', () => {
    expect(portInUseMessage(busy(4000), config)).toMatch(/set PORT or MAIL_CATCHER_PORT/);
    expect(portInUseMessage(new Error('boom'), config)).toBeNull();
    expect(portInUseMessage({ code: 'EACCES', port: 80 }, config)).toBeNull();
  });
});
