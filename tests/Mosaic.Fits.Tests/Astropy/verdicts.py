"""For each FITS file given, whether astropy.io.fits refuses it: open, verify('exception') and read every HDU's data.

Usage: verdicts.py FILE...   Prints one JSON object: {file name: null if read, else astropy's message}.
An outside opinion on whether a hand-made broken file is broken; astropy is lenient in places, so a null is no proof.
Each file is tried in a forked child, because some broken files kill the compiled decompressor under astropy
(reported as "died with signal N").
"""
import json
import os
import sys
import warnings

from astropy.io import fits


def check(path):
    warnings.simplefilter('error')      # astropy's non-standard warnings count as refusals
    warnings.simplefilter('ignore', ResourceWarning)
    try:
        with fits.open(path, memmap=False) as hdul:
            hdul.verify('exception')
            for hdu in hdul:
                if hdu.data is not None:
                    _ = hdu.data.sum() if hasattr(hdu.data, 'sum') else len(hdu.data)
        return None
    except Exception as e:       # noqa: BLE001 - any refusal counts
        return f"{type(e).__name__}: {e}"[:300]


verdicts = {}
for path in sys.argv[1:]:
    read_end, write_end = os.pipe()
    pid = os.fork()
    if pid == 0:
        os.close(read_end)
        with os.fdopen(write_end, 'w') as out:
            out.write(json.dumps(check(path)))
        os._exit(0)
    os.close(write_end)
    with os.fdopen(read_end) as result:
        text = result.read()
    _, status = os.waitpid(pid, 0)
    name = os.path.basename(path)
    if os.WIFSIGNALED(status):
        verdicts[name] = f"astropy's reader died with signal {os.WTERMSIG(status)}"
    else:
        verdicts[name] = json.loads(text) if text else "astropy's reader exited without an answer"
print(json.dumps(verdicts))
