#!/usr/bin/python3
"""Reference files for the NPY, NPZ and WAV readers of package trace.

Written by general-purpose reference writers, so that the readers are
checked against files they did not produce:
  - NumPy (numpy.save, numpy.savez, numpy.savez_compressed) for .npy/.npz;
  - Python's standard `wave` module for PCM WAV (8, 16, 24, 32 bits);
  - SciPy's scipy.io.wavfile.write for IEEE-float WAV (32, 64 bits), which
    `wave` cannot write.
Each file X comes with X.expect.csv: the samples of the channel the test
reads, one per line, printed with Python's repr (the shortest text that
reads back to the same float64). manifest.csv lists file, the --column
choice and the expected sampling interval (0 when the format has none).

Run with Debian's python3-numpy and python3-scipy (bookworm: NumPy 1.24.2,
SciPy 1.10.1, Python 3.11.2):  /usr/bin/python3 make_golden.py
CI has no Python: the output is committed.
"""
import sys
import wave

import numpy as np
import scipy
import scipy.io.wavfile

N = 300


def logistic(n, x=0.3, r=3.9):
    out = []
    for _ in range(n):
        x = r * x * (1.0 - x)
        out.append(x)
    return np.array(out, dtype=np.float64)


manifest = []


def expect(name, column, values, interval=0.0):
    with open(name + ".expect.csv", "w") as f:
        for v in values:
            f.write(repr(float(v)) + "\n")
    manifest.append((name, column, repr(float(interval))))


x = logistic(N)
ints = np.round((x - 0.5) * 20000).astype(np.int64)

# NPY, every numeric dtype family, both byte orders.
np.save("f8.npy", x)
expect("f8.npy", "", x)
np.save("f4_be.npy", x.astype(">f4"))
expect("f4_be.npy", "", x.astype(">f4"))
np.save("f2.npy", x.astype("<f2"))
expect("f2.npy", "", x.astype("<f2"))
np.save("i2.npy", ints.astype("<i2"))
expect("i2.npy", "", ints.astype("<i2"))
np.save("i8_be.npy", (ints * 1000003).astype(">i8"))
expect("i8_be.npy", "", (ints * 1000003).astype(">i8"))
np.save("u1.npy", (np.round(x * 255)).astype("u1"))
expect("u1.npy", "", (np.round(x * 255)).astype("u1"))
np.save("u4_be.npy", (ints + 40000).astype(">u4"))
expect("u4_be.npy", "", (ints + 40000).astype(">u4"))
table = np.stack([np.arange(N) * 1e-3, x, -2 * x], axis=1)
np.save("table.npy", table)
expect("table.npy", "2", table[:, 1])
np.save("table_fortran.npy", np.asfortranarray(table.astype(">f4")))
expect("table_fortran.npy", "3", table.astype(">f4")[:, 2])

# NPZ, stored and deflated.
np.savez("run.npz", time=np.arange(N) * 1e-3, current=x, table=table)
expect("run.npz", "current", x)
np.savez_compressed("run_compressed.npz", table=table)
expect("run_compressed.npz", "table/3", table[:, 2])

# WAV through the standard library (PCM) and SciPy (float).
def pcm(name, width, channels, frames, rate):
    with wave.open(name, "wb") as w:
        w.setnchannels(channels)
        w.setsampwidth(width)
        w.setframerate(rate)
        w.writeframes(frames)

s16 = ints.astype("<i2")
pcm("pcm16.wav", 2, 1, s16.tobytes(), 48000)
expect("pcm16.wav", "", s16, 1 / 48000)
stereo = np.stack([s16, (-s16 // 2).astype("<i2")], axis=1).astype("<i2")
pcm("pcm16_stereo.wav", 2, 2, stereo.tobytes(), 44100)
expect("pcm16_stereo.wav", "2", stereo[:, 1], 1 / 44100)
s24 = ints * 300 + 7
b24 = b"".join(int(v).to_bytes(3, "little", signed=True) for v in s24)
pcm("pcm24.wav", 3, 1, b24, 96000)
expect("pcm24.wav", "", s24, 1 / 96000)
s32 = (ints * 100003).astype("<i4")
pcm("pcm32.wav", 4, 1, s32.tobytes(), 1000)
expect("pcm32.wav", "", s32, 1 / 1000)
u8 = np.round(x * 255).astype("u1")
pcm("pcm8.wav", 1, 1, u8.tobytes(), 8000)
expect("pcm8.wav", "", u8.astype(np.int64) - 128, 1 / 8000)
scipy.io.wavfile.write("float32.wav", 10000, x.astype(np.float32))
expect("float32.wav", "", x.astype(np.float32), 1 / 10000)
scipy.io.wavfile.write("float64_stereo.wav", 250, np.stack([x, x * x], axis=1))
expect("float64_stereo.wav", "2", x * x, 1 / 250)

with open("manifest.csv", "w") as f:
    f.write("file,column,interval\n")
    for name, column, interval in manifest:
        f.write(f"{name},{column},{interval}\n")
with open("VERSIONS", "w") as f:
    f.write(f"NumPy {np.__version__}, SciPy {scipy.__version__}, Python {sys.version.split()[0]} (wave module)\n")
