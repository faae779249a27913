"""Shared by the reference scripts: what astropy.io.fits reads from a file, as JSON-ready data."""
import numpy as np
from astropy.io import fits


def card_json(card):
    image = card.image
    keyword = card.keyword
    hierarch = image.startswith('HIERARCH')
    commentary = keyword in ('COMMENT', 'HISTORY', '') or (not hierarch and image[8:10] != '= ')
    value = card.value
    if commentary:
        return {'k': keyword, 't': 'commentary', 'v': str(value)}
    comment = card.comment
    if isinstance(value, fits.card.Undefined):
        return {'k': keyword, 't': 'undef', 'c': comment}
    if isinstance(value, (bool, np.bool_)):
        return {'k': keyword, 't': 'bool', 'v': bool(value), 'c': comment}
    if isinstance(value, (int, np.integer)):
        # As text: JSON readers lose integers beyond 64 bits.
        return {'k': keyword, 't': 'int', 'v': str(int(value)), 'c': comment}
    if isinstance(value, (float, np.floating)):
        return {'k': keyword, 't': 'float', 'v': repr(float(value)), 'c': comment}
    if isinstance(value, complex):
        return {'k': keyword, 't': 'complex', 'v': [repr(value.real), repr(value.imag)], 'c': comment}
    return {'k': keyword, 't': 'str', 'v': str(value), 'c': comment}


def floats(array):
    return [None if np.isnan(v) else repr(float(v)) for v in array]


def image_json(hdu):
    if not isinstance(hdu, (fits.PrimaryHDU, fits.ImageHDU)) or hdu.data is None or hdu.data.ndim < 2:
        return None
    data = hdu.data
    while data.ndim > 2:
        data = data[0]          # first 2-D plane
    flat = np.ascontiguousarray(data).ravel()
    with np.errstate(over='ignore'):     # float64 beyond the float32 range becomes inf, as intended
        f32 = floats(flat.astype(np.float32))
    exact = [str(int(v)) for v in flat] if flat.dtype.kind in 'iu' else floats(flat.astype(np.float64))
    return {
        'width': int(data.shape[1]),
        'height': int(data.shape[0]),
        'dtype': str(flat.dtype),
        'exact': exact,
        'f64': floats(flat.astype(np.float64)),
        'f32': f32,
        'blank': hdu.header.get('BLANK'),
    }


def file_json(path):
    with fits.open(path) as hdul:
        return [{
            'index': i,
            'header_offset': hdul.fileinfo(i)['hdrLoc'],
            'data_offset': hdul.fileinfo(i)['datLoc'],
            'data_span': hdul.fileinfo(i)['datSpan'],
            'xtension': hdu.header.get('XTENSION'),
            'extname': hdu.header.get('EXTNAME'),
            'cards': [card_json(c) for c in hdu.header.cards],
            'image': image_json(hdu),
        } for i, hdu in enumerate(hdul)]
