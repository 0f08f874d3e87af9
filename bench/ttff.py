"""Time from spawn to the first dialogue frame in a real pseudo-terminal (80x24), then Ctrl-C.

Prints one number: milliseconds. Used by bench/run.mjs; needs python3 (standard library only).
"""
import fcntl, os, pty, select, struct, sys, termios, time

def main():
    cli = sys.argv[1]
    marker = sys.argv[2].encode()
    env = dict(os.environ, CI="false", NO_COLOR="1", XDG_STATE_HOME=sys.argv[3])
    start = time.monotonic()
    pid, fd = pty.fork()
    if pid == 0:
        os.execvpe("node", ["node", cli], env)
    fcntl.ioctl(fd, termios.TIOCSWINSZ, struct.pack("HHHH", 24, 80, 0, 0))
    seen = b""
    deadline = start + 20
    while marker not in seen and time.monotonic() < deadline:
        ready, _, _ = select.select([fd], [], [], 0.05)
        if ready:
            try:
                seen += os.read(fd, 65536)
            except OSError:
                break
    elapsed = (time.monotonic() - start) * 1000
    os.write(fd, b"\x03")
    try:
        os.waitpid(pid, 0)
    except ChildProcessError:
        pass
    print(f"{elapsed:.1f}" if marker in seen else "nan")

main()
