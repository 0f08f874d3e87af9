"""Drive the CLI in a real pseudo-terminal (80x24): type lines, then end it with a signal.

usage: pty-drive.py STATE_DIR SIGNAL LINE... ; prints the exit status and the screen text as JSON.
SIGNAL is INT (sent as Ctrl-C), TERM, HUP, or NONE (wait for the program to end by itself).
"""
import fcntl, json, os, pty, select, signal, struct, sys, termios, time

state, sig, lines = sys.argv[1], sys.argv[2], sys.argv[3:]
cli = os.environ["DCTRIAGE_CLI"]
env = dict(os.environ, CI="false", NO_COLOR="1", XDG_STATE_HOME=state)
pid, fd = pty.fork()
if pid == 0:
    os.execvpe("node", ["node", cli] + json.loads(os.environ.get("DCTRIAGE_ARGS", "[]")), env)
fcntl.ioctl(fd, termios.TIOCSWINSZ, struct.pack("HHHH", 24, 80, 0, 0))
seen = b""

def pump(seconds):
    global seen
    end = time.monotonic() + seconds
    while time.monotonic() < end:
        r, _, _ = select.select([fd], [], [], 0.05)
        if r:
            try:
                seen += os.read(fd, 65536)
            except OSError:
                return

pump(1.5)
for line in lines:
    os.write(fd, line.encode() + b"\r")
    pump(0.5)
if sig == "INT":
    os.write(fd, b"\x03")
elif sig in ("TERM", "HUP"):
    os.kill(pid, getattr(signal, "SIG" + sig))
pump(1.0)
_, status = os.waitpid(pid, 0)
code = os.waitstatus_to_exitcode(status)
print(json.dumps({"code": code, "screen": seen.decode("utf-8", "replace")}))
