#!/usr/bin/python3
"""GDAL / numpy / scipy side of the Loftline benchmark: a line-oriented JSON server on stdin/stdout.

Each request is one JSON line; each reply one JSON line with wall milliseconds ("ms") and check values.
  {"cmd": "decode", "file": F, "threads": 1|2}      full ReadAsArray (GDAL_NUM_THREADS)
  {"cmd": "lines", "file": F, "windows": [[xoff, yoff, xsize, ysize], ...]}   fresh dataset, one read per window
  {"cmd": "load", "file": F}                          keep the full array for the sampling runs
  {"cmd": "samples", "cols": [...], "rows": [...]}   pixel-centre coordinates (col, row), float64, kept
  {"cmd": "map_coordinates"}                          scipy.ndimage.map_coordinates(order=1) at the kept points
  {"cmd": "numpy_bilinear"}                           the same with plain numpy indexing
  {"cmd": "memory", "file": F}                        peak RSS of a fresh process decoding F (bytes)
  {"cmd": "versions"}
"""
import json, subprocess, sys, time
import numpy as np
import scipy
from scipy import ndimage
from osgeo import gdal

gdal.UseExceptions()
state = {}


def decode(f, threads):
    gdal.SetConfigOption('GDAL_NUM_THREADS', str(threads))
    t = time.perf_counter()
    ds = gdal.Open(f)
    a = ds.GetRasterBand(1).ReadAsArray()
    ms = (time.perf_counter() - t) * 1000
    ds = None
    gdal.SetConfigOption('GDAL_NUM_THREADS', None)
    return {'ms': ms, 'check': float(a[4321, 1234]), 'bytes': int(a.nbytes)}


def lines(f, windows):
    t = time.perf_counter()
    ds = gdal.Open(f)
    band = ds.GetRasterBand(1)
    total = 0.0
    px = 0
    for (x, y, w, h) in windows:
        a = band.ReadAsArray(x, y, w, h)
        total += float(a[h // 2, w // 2])
        px += a.size
    ms = (time.perf_counter() - t) * 1000
    ds = None
    return {'ms': ms, 'check': total, 'pixels': px}


def bilinear_numpy(a, rows, cols):
    r0 = np.floor(rows).astype(np.intp)
    c0 = np.floor(cols).astype(np.intp)
    tr = rows - r0
    tc = cols - c0
    v00 = a[r0, c0]; v01 = a[r0, c0 + 1]; v10 = a[r0 + 1, c0]; v11 = a[r0 + 1, c0 + 1]
    top = v00 + (v01 - v00) * tc
    return top + (v10 + (v11 - v10) * tc - top) * tr


def main():
    for line in sys.stdin:
        req = json.loads(line)
        cmd = req['cmd']
        if cmd == 'decode':
            out = decode(req['file'], req.get('threads', 1))
        elif cmd == 'lines':
            out = lines(req['file'], req['windows'])
        elif cmd == 'load':
            ds = gdal.Open(req['file'])  # keep the dataset alive while its band is read (GDAL's Python rule)
            state['a'] = ds.GetRasterBand(1).ReadAsArray()
            ds = None
            out = {'ms': 0}
        elif cmd == 'samples':
            state['rows'] = np.asarray(req['rows'], dtype=np.float64)
            state['cols'] = np.asarray(req['cols'], dtype=np.float64)
            out = {'ms': 0, 'n': int(state['rows'].size)}
        elif cmd in ('map_coordinates', 'numpy_bilinear'):
            a, rows, cols = state['a'], state['rows'], state['cols']
            t = time.perf_counter()
            if cmd == 'map_coordinates':
                v = ndimage.map_coordinates(a, [rows, cols], order=1, mode='nearest', prefilter=False)
            else:
                v = bilinear_numpy(a, rows, cols)
            ms = (time.perf_counter() - t) * 1000
            out = {'ms': ms, 'first': [float(x) for x in v[:1000]]}
        elif cmd == 'memory':
            # VmHWM (peak resident set of this process image; getrusage's maxrss would be inherited across exec)
            hwm = "int([l for l in open('/proc/self/status') if l.startswith('VmHWM')][0].split()[1]) * 1024"
            base = subprocess.run([sys.executable, '-c', 'from osgeo import gdal; import numpy; print(%s)' % hwm],
                                  capture_output=True, text=True, check=True).stdout.split()
            code = ('from osgeo import gdal; gdal.UseExceptions(); ds = gdal.Open(%r); '
                    'a = ds.GetRasterBand(1).ReadAsArray(); print(%s, a.nbytes)') % (req['file'], hwm)
            peak, nbytes = subprocess.run([sys.executable, '-c', code], capture_output=True, text=True, check=True).stdout.split()
            out = {'ms': 0, 'peakBytes': int(peak) - int(base[0]), 'decodedBytes': int(nbytes)}
        elif cmd == 'versions':
            out = {'gdal': gdal.__version__, 'numpy': np.__version__, 'scipy': scipy.__version__,
                   'python': sys.version.split()[0]}
        else:
            out = {'error': 'unknown command ' + cmd}
        sys.stdout.write(json.dumps(out) + '\n')
        sys.stdout.flush()


if __name__ == '__main__':
    main()
