#!/usr/bin/python3
"""Write the benchmark DEMs with GDAL: an 8000 x 8000 float32 1 m grid (UTM 33N), synthetic hills.

  bench-tiled.tif    DEFLATE + floating-point predictor (PREDICTOR=3), 512 x 512 tiles
  bench-striped.tif  the same heights, uncompressed, striped
Usage: /usr/bin/python3 bench/make-bench-dem.py OUT_DIR
"""
import os, sys
import numpy as np
from osgeo import gdal, osr

gdal.UseExceptions()
N = 8000
out = sys.argv[1]
os.makedirs(out, exist_ok=True)
rng = np.random.default_rng(20240601)
y, x = np.mgrid[0:N, 0:N].astype(np.float32)
z = (300 + 60 * np.sin(x / 900) * np.cos(y / 700) + 25 * np.sin((x + 2 * y) / 350)
     + 0.004 * x).astype(np.float32)
# fine detail, like a real lidar-derived surface (keeps DEFLATE honest)
z += np.repeat(np.repeat(rng.normal(0, 0.6, (N // 8, N // 8)).astype(np.float32), 8, 0), 8, 1)
z += rng.normal(0, 0.05, (N, N)).astype(np.float32)
z = np.round(z * 100) / 100
srs = osr.SpatialReference()
srs.ImportFromEPSG(32633)
mem = gdal.GetDriverByName('MEM').Create('', N, N, 1, gdal.GDT_Float32)
mem.SetGeoTransform((500000.0, 1.0, 0.0, 5560000.0, 0.0, -1.0))
mem.SetProjection(srs.ExportToWkt())
mem.GetRasterBand(1).WriteArray(z)
mem.GetRasterBand(1).SetNoDataValue(-9999)
gtiff = gdal.GetDriverByName('GTiff')
gtiff.CreateCopy(os.path.join(out, 'bench-tiled.tif'), mem,
                 options=['TILED=YES', 'BLOCKXSIZE=512', 'BLOCKYSIZE=512', 'COMPRESS=DEFLATE', 'PREDICTOR=3'])
gtiff.CreateCopy(os.path.join(out, 'bench-striped.tif'), mem, options=['COMPRESS=NONE'])
print('wrote', out)
