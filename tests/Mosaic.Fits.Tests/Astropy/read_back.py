"""Reads one FITS file with astropy.io.fits, after astropy's own standard check, and prints the JSON of what it read.

Usage: read_back.py FILE
Exits non-zero (with astropy's message) if astropy finds the file non-conforming.
"""
import json
import sys
import warnings

from astropy.io import fits

import fits_dump

warnings.simplefilter('error')      # astropy's non-standard warnings count as failures
with fits.open(sys.argv[1]) as hdul:
    hdul.verify('exception')
print(json.dumps(fits_dump.file_json(sys.argv[1])))
