"""A serial port for the link's tests: a pseudo-terminal whose bytes go to a UDP port on loopback and back.

Usage: python3 pty-udp-bridge.py UDP_PORT. Prints the terminal's path (e.g. /dev/pts/7) on one line, then bridges
until killed. Debian's python3 standard library only (pty, select, socket).
"""
import os
import pty
import select
import socket
import sys
import tty

master, slave = pty.openpty()
tty.setraw(slave)  # no echo, no line editing: the bytes pass as they are
target = ("127.0.0.1", int(sys.argv[1]))
sock = socket.socket(socket.AF_INET, socket.SOCK_DGRAM)
sock.bind(("127.0.0.1", 0))
print(os.ttyname(slave), flush=True)
while True:
    ready, _, _ = select.select([master, sock], [], [])
    if master in ready:
        try:
            data = os.read(master, 4096)
        except OSError:
            continue
        if data:
            sock.sendto(data, target)
    if sock in ready:
        data, _ = sock.recvfrom(65535)
        os.write(master, data)
