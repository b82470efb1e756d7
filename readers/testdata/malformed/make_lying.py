#!/usr/bin/env python3
"""Write compressed legacy VTK files whose container lies about the
decompressed size (Python standard library only; the zstd frame is built
by hand from RFC 8878).

    python3 readers/testdata/malformed/make_lying.py readers/testdata/malformed

Both hold the same 151-byte BINARY stream: an UNSTRUCTURED_GRID header whose
POINTS line declares 10^7 float points (120 MB) followed by only 12 floats
(48 bytes). The container claims far more than it holds:

lying_isize.vtk.gz  gzip (RFC 1952) whose trailer ISIZE (last 4 bytes,
                    little-endian) is patched to 0xFFFFFFFF (4 GiB - 1);
                    the CRC-32 is left as computed.
lying_fcs.vtk.zst   one zstd frame (RFC 8878 §3.1.1) with an 8-byte
                    Frame_Content_Size of 2^40 and a 1 MiB window, holding
                    the stream as two raw blocks (§3.1.1.2): the header
                    lines, then the data, so that a decoder delivers the
                    header before the frame ends and the lie shows.

A reader that trusted either size could allocate the 10^7 points (240 MB as
float64) before seeing the data end; readers/malformed_test.go requires the
read to fail while allocating less than 10 MB.
"""
import gzip
import os
import struct
import sys

HEADER = (b"# vtk DataFile Version 4.2\n"
          b"lying container size\n"
          b"BINARY\n"
          b"DATASET UNSTRUCTURED_GRID\n"
          b"POINTS 10000000 float\n")
DATA = struct.pack(">12f", *[float(i) for i in range(12)])


def lying_gzip(raw):
    z = bytearray(gzip.compress(raw, mtime=0))
    z[-4:] = struct.pack("<I", 0xFFFFFFFF)
    return bytes(z)


def lying_zstd(blocks):
    magic = struct.pack("<I", 0xFD2FB528)
    fhd = 0xC0                 # FCS_Field_Size 8 bytes, not single-segment, no checksum, no dictionary
    window = (10 << 3) | 0     # Window_Log = 10 + 10: 1 MiB
    fcs = struct.pack("<Q", 1 << 40)
    out = magic + bytes([fhd, window]) + fcs
    for i, b in enumerate(blocks):
        assert len(b) < 128 << 10
        last = 1 if i == len(blocks) - 1 else 0
        out += struct.pack("<I", (len(b) << 3) | (0 << 1) | last)[:3] + b  # Raw_Block
    return out


def main(out):
    with open(os.path.join(out, "lying_isize.vtk.gz"), "wb") as f:
        f.write(lying_gzip(HEADER + DATA))
    with open(os.path.join(out, "lying_fcs.vtk.zst"), "wb") as f:
        f.write(lying_zstd([HEADER, DATA]))


if __name__ == "__main__":
    main(sys.argv[1] if len(sys.argv) > 1 else ".")
