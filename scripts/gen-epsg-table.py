#!/usr/bin/env python3
"""Generate terrain/data/epsg-proj.json: every EPSG map or geographic CRS as PROJ 9 itself defines it.

Run (Debian: apt-get install -y proj-bin proj-data python3):
    python3 scripts/gen-epsg-table.py > terrain/data/epsg-proj.json

For each non-deprecated EPSG projected, geographic 2D/3D and compound CRS in PROJ's own database
(/usr/share/proj/proj.db), through libproj's C API (ctypes, no extra Python packages):
  - the CRS's PROJ.4 string (proj_as_proj_string), its datum replaced by the exact ellipsoid (+a, +rf or +b)
    so that proj4js applies no built-in datum table of its own;
  - the list of operations PROJ itself would use to reach WGS 84 (EPSG:4326), in PROJ's order, as cs2cs does
    (proj_create_operations with partial-intersection spatial test, operations whose grids are not installed
    discarded). Each Helmert / geocentric-translation step becomes a +towgs84 (position-vector convention,
    proj_coordoperation_get_towgs84_values) with the operation's area of use, so the reader can pick, per point,
    the most accurate operation whose area holds the point, like proj_trans does.
  - a transformation that is one NTv2 grid Debian's proj-data ships (BETA2007.gsb, nzgd2kgrid0005.gsb, ...)
    becomes +nadgrids=FILE, applied by proj4js from the file's bytes (loaded by the server or command line);
  - CRSs that PROJ places only through another grid file, a non-Helmert method, or a ballpark (no EPSG transformation
    to WGS 84) get a refusal naming the CRS and the missing transformation instead of a definition.
"""
import ctypes as C
import json
import sqlite3
import sys

P = C.CDLL('libproj.so.25')
vp, cp, D, I = C.c_void_p, C.c_char_p, C.c_double, C.c_int


def fn(name, res, *args):
    f = getattr(P, name)
    f.restype = res
    f.argtypes = list(args)
    return f


ctx = fn('proj_context_create', vp)()
create = fn('proj_create', vp, vp, cp)
destroy = fn('proj_destroy', vp, vp)
get_name = fn('proj_get_name', cp, vp)
get_type = fn('proj_get_type', I, vp)
get_id_code = fn('proj_get_id_code', cp, vp, I)
area_of_use = fn('proj_get_area_of_use', I, vp, vp, C.POINTER(D), C.POINTER(D), C.POINTER(D), C.POINTER(D), C.POINTER(cp))
as_proj = fn('proj_as_proj_string', cp, vp, vp, I, vp)
get_ellipsoid = fn('proj_get_ellipsoid', vp, vp, vp)
ell_params = fn('proj_ellipsoid_get_parameters', I, vp, vp, C.POINTER(D), C.POINTER(D), C.POINTER(I), C.POINTER(D))
fctx_new = fn('proj_create_operation_factory_context', vp, vp, cp)
set_spatial = fn('proj_operation_factory_context_set_spatial_criterion', None, vp, vp, I)
set_grid = fn('proj_operation_factory_context_set_grid_availability_use', None, vp, vp, I)
create_ops = fn('proj_create_operations', vp, vp, vp, vp, vp)
list_count = fn('proj_list_get_count', I, vp)
list_get = fn('proj_list_get', vp, vp, vp, I)
list_destroy = fn('proj_list_destroy', None, vp)
step_count = fn('proj_concatoperation_get_step_count', I, vp, vp)
get_step = fn('proj_concatoperation_get_step', vp, vp, vp, I)
towgs84 = fn('proj_coordoperation_get_towgs84_values', I, vp, vp, C.POINTER(D), I, I)
grid_count = fn('proj_coordoperation_get_grid_used_count', I, vp, vp)
grid_used = fn('proj_coordoperation_get_grid_used', I, vp, vp, I, C.POINTER(cp), C.POINTER(cp), C.POINTER(cp), C.POINTER(cp), C.POINTER(I), C.POINTER(I), C.POINTER(I))
get_accuracy = fn('proj_coordoperation_get_accuracy', D, vp, vp)
method_info = fn('proj_coordoperation_get_method_info', I, vp, vp, C.POINTER(cp), C.POINTER(cp), C.POINTER(cp))
fn('proj_log_level', I, vp, I)(ctx, 0)

T_CONVERSION, T_TRANSFORMATION, T_CONCATENATED = 21, 22, 23
fctx = fctx_new(ctx, None)
set_spatial(ctx, fctx, 1)  # PROJ_SPATIAL_CRITERION_PARTIAL_INTERSECTION, as proj_create_crs_to_crs
set_grid(ctx, fctx, 1)  # PROJ_GRID_AVAILABILITY_DISCARD_OPERATION_IF_MISSING_GRID, as cs2cs without network
fctx_all = fctx_new(ctx, None)
set_spatial(ctx, fctx_all, 1)
set_grid(ctx, fctx_all, 2)  # PROJ_GRID_AVAILABILITY_IGNORED: to name a grid that is not installed
WGS84 = create(ctx, b'EPSG:4326')


def s(b):
    return b.decode('utf-8') if b else ''


def bbox_of(obj):
    """[west, south, east, north] of the area of use, with 1 appended when PROJ counts it as offshore."""
    w, so, e, n = D(), D(), D(), D()
    name = cp()
    if not area_of_use(ctx, obj, C.byref(w), C.byref(so), C.byref(e), C.byref(n), C.byref(name)):
        return None
    box = [round(w.value, 6), round(so.value, 6), round(e.value, 6), round(n.value, 6)]
    # proj_trans prefers an onshore operation to one whose area name says offshore (PROJ 9 4D_api.cpp)
    return box + [1] if '- offshore' in s(name.value) else box


def num(v):
    """Shortest exact text for a parameter."""
    r = repr(float(v))
    return r[:-2] if r.endswith('.0') else r


def ellipsoid_terms(crs):
    ell = get_ellipsoid(ctx, crs)
    a, b, rf, computed = D(), D(), D(), I()
    ell_params(ctx, ell, C.byref(a), C.byref(b), C.byref(computed), C.byref(rf))
    destroy(ell)
    if rf.value == 0 or b.value == a.value:
        return f'+a={num(a.value)} +b={num(a.value)}'
    return f'+a={num(a.value)} +rf={num(rf.value)}' if computed.value else f'+a={num(a.value)} +b={num(b.value)}'


DROP = ('+datum=', '+ellps=', '+a=', '+b=', '+rf=', '+R=', '+f=', '+towgs84=', '+nadgrids=', '+type=', '+no_defs')


def crs_definition(crs):
    p4 = s(as_proj(ctx, crs, 1, None))  # PJ_PROJ_4
    if not p4:
        return None
    if '+nadgrids=@null' in p4:  # Pseudo-Mercator: PROJ's own sphere trick, kept whole
        return p4.replace(' +type=crs', '')
    wgs = '+datum=WGS84' in p4
    terms = [t for t in p4.split() if not t.startswith(DROP)]
    terms.append('+datum=WGS84' if wgs else ellipsoid_terms(crs))
    return ' '.join(terms + ['+no_defs'])


def op_shift(op):
    """(towgs84 list or None for no shift, problem text or None)."""
    t = get_type(op)
    steps = [get_step(ctx, op, k) for k in range(step_count(ctx, op))] if t == T_CONCATENATED else [op]
    shifts = []
    grid = None
    for st in steps:
        st_type = get_type(st)
        if st_type == T_CONVERSION:
            continue
        m_name, m_auth, m_code = cp(), cp(), cp()
        method_info(ctx, st, C.byref(m_name), C.byref(m_auth), C.byref(m_code))
        if s(m_code.value) == '9601':  # longitude rotation: the CRS's own +pm already carries it
            continue
        if s(m_code.value) == '9619' and s(get_name(st)).startswith('Null geographic offset'):
            continue
        if grid_count(ctx, st) > 0:
            short, full, pkg, url = cp(), cp(), cp(), cp()
            dd, ol, av = I(), I(), I()
            grid_used(ctx, st, 0, C.byref(short), C.byref(full), C.byref(pkg), C.byref(url), C.byref(dd), C.byref(ol), C.byref(av))
            path = s(full.value) or ''
            if grid_count(ctx, st) == 1 and av.value and path.endswith('.gsb') and grid is None and '+proj=hgridshift' in s(as_proj(ctx, st, 0, None)):
                # an NTv2 grid Debian's proj-data ships (e.g. BETA2007.gsb): proj4js applies it itself (+nadgrids),
                # with the file read by the server or command line from its grid directory
                grid = path.rsplit('/', 1)[-1]
                continue
            return None, f'the datum-shift grid {s(short.value)} ({s(get_name(st))})'
        vals = (D * 7)()
        if not towgs84(ctx, st, vals, 7, 0):
            return None, f'the transformation {s(get_name(st))}, whose method is not a Helmert shift'
        v = [round(x, 9) for x in vals]
        if s(get_name(st)).startswith('Inverse of ') and '+inv +proj=helmert' in s(as_proj(ctx, st, 0, None)):
            # PROJ keeps some inverted Helmerts as the forward one run backwards (e.g. rotations in microradians):
            # the API then gives the forward parameters, and the inverse negates them (to first order: the
            # neglected rotation x translation term is below a millimetre for EPSG's Helmert shifts)
            v = [-x if x else 0 for x in v]
        if any(x != 0 for x in v):
            shifts.append(v)
    for st in steps:
        if st is not op:
            destroy(st)
    if grid is not None:
        if shifts:  # proj4js applies a grid or a Helmert, not both in turn
            return None, f'the datum-shift grid {grid} and a Helmert shift in turn ({s(get_name(op))})'
        return '+nadgrids=' + grid, None
    if not shifts:
        return [0, 0, 0], None
    v = shifts[0]
    for nxt in shifts[1:]:
        v = compose(v, nxt)
    return (v[:3] if all(x == 0 for x in v[3:]) else v), None


def helmert_matrix(v):
    """(translation, 3x3 matrix) of a position-vector +towgs84 (metres, arc-seconds, ppm), PROJ's small-angle form."""
    v = list(v) + [0] * (7 - len(v))
    k = 4.84813681109536e-06  # radians per arc-second
    rx, ry, rz, m = v[3] * k, v[4] * k, v[5] * k, 1 + v[6] * 1e-6
    return v[:3], [[m, -m * rz, m * ry], [m * rz, m, -m * rx], [-m * ry, m * rx, m]]


def compose(first, second):
    """One +towgs84 equal to `first` then `second` (PROJ applies chained Helmerts in turn in geocentric space):
    t = t2 + M2 t1, M = M2 M1; the neglected second-order rotation terms are below 1e-5 m at the earth's radius."""
    t1, m1 = helmert_matrix(first)
    t2, m2 = helmert_matrix(second)
    t = [t2[i] + sum(m2[i][j] * t1[j] for j in range(3)) for i in range(3)]
    m = [[sum(m2[i][k] * m1[k][j] for k in range(3)) for j in range(3)] for i in range(3)]
    scale = (m[0][0] + m[1][1] + m[2][2]) / 3
    k = 4.84813681109536e-06
    rx = (m[2][1] - m[1][2]) / 2 / scale / k
    ry = (m[0][2] - m[2][0]) / 2 / scale / k
    rz = (m[1][0] - m[0][1]) / 2 / scale / k
    return [round(x, 9) for x in (*t, rx, ry, rz, (scale - 1) * 1e6)]


def base_name(op_name):
    """'Inverse of UTM zone 31N + ED50 to WGS 84 (1)' -> 'ED50 to WGS 84 (1)'."""
    parts = [p for p in op_name.split(' + ') if not p.startswith('Inverse of ') and ' to ' in p]
    return ' + '.join(parts) if parts else op_name


def missing_grid(crs):
    """'the datum-shift grid X (transformation)' of the first grid-based operation PROJ knows, installed or not."""
    ops = create_ops(ctx, crs, WGS84, fctx_all)
    found = None
    for i in range(list_count(ops) if ops else 0):
        op = list_get(ctx, ops, i)
        t = get_type(op)
        steps = [get_step(ctx, op, k) for k in range(step_count(ctx, op))] if t == T_CONCATENATED else [op]
        for st in steps:
            if found is None and grid_count(ctx, st) > 0:
                short, full, pkg, url = cp(), cp(), cp(), cp()
                dd, ol, av = I(), I(), I()
                grid_used(ctx, st, 0, C.byref(short), C.byref(full), C.byref(pkg), C.byref(url), C.byref(dd), C.byref(ol), C.byref(av))
                found = f'the datum-shift grid {s(short.value)} ({s(get_name(st))})'
        destroy(op)
        if found:
            break
    if ops:
        list_destroy(ops)
    return found


def classify(crs, name, definition):
    same_datum = '+datum=WGS84' in definition
    ops = create_ops(ctx, crs, WGS84, fctx)
    n = list_count(ops) if ops else 0
    found = []
    problem = None
    ballpark = False
    for i in range(n):
        op = list_get(ctx, ops, i)
        op_name = s(get_name(op))
        if 'Ballpark' in op_name:
            ballpark = True
            destroy(op)
            continue
        if get_type(op) == T_CONVERSION:  # same datum as WGS 84: a map projection only
            destroy(op)
            found = [None]
            break
        shift, why = op_shift(op)
        bbox = bbox_of(op)
        accuracy = get_accuracy(ctx, op)
        destroy(op)
        if why:
            problem = why
            break
        found.append((shift, bbox, base_name(op_name), round(accuracy, 3)))
    if ops:
        list_destroy(ops)
    if problem:
        return {'refuse': f'{name} reaches WGS 84 in PROJ only through {problem}, which Loftline cannot apply'}
    if found == [None] or (not found and same_datum):
        return {'shifts': []}
    if not found:
        missing = missing_grid(crs)
        if missing:
            return {'refuse': f'{name} reaches WGS 84 in PROJ only through {missing}, which is not in Debian proj-data and which Loftline cannot apply'}
    if not found and ballpark and '+a=6378137 ' in definition:
        # a modern earth-centred datum (GRS 1980 / WGS 84 ellipsoid, e.g. CGCS2000, NAD83(CSRS)) with no EPSG
        # transformation: PROJ applies none (its ballpark), which stays within a few metres of WGS 84; kept
        # visible as a named zero shift
        return {'shifts': [([0, 0, 0], None, 'no EPSG transformation to WGS 84: PROJ applies none (ballpark, metre-level)', -1)]}
    if not found:
        why = 'EPSG defines no transformation from its datum to WGS 84' if ballpark else 'PROJ finds no transformation to WGS 84'
        return {'refuse': f'{name}: {why}'}
    return {'shifts': found}


def unit_problem(definition):
    """A description of a length unit Loftline's grids cannot carry (metre, foot, US survey foot only), or None."""
    if '+proj=longlat' in definition:
        return None
    for term in definition.split():
        if term.startswith('+units=') and term[7:] not in ('m', 'ft', 'us-ft'):
            return f'the length unit "{term[7:]}"'
        if term.startswith('+to_meter='):
            f = float(term[10:])
            if abs(f - 0.3048) > 1e-12 and abs(f - 1200 / 3937) > 1e-12 and abs(f - 1) > 1e-12:
                return f'a length unit of {f} m'
    return None


def main():
    db = sqlite3.connect('/usr/share/proj/proj.db')
    rows = db.execute(
        "select code, 'P' from projected_crs where auth_name='EPSG' and deprecated=0 "
        "union all select code, case type when 'geographic 3D' then 'G3' else 'G' end from geodetic_crs where auth_name='EPSG' and deprecated=0 and type like 'geographic%' "
    ).fetchall()
    compounds = db.execute(
        "select code, horiz_crs_code from compound_crs where auth_name='EPSG' and deprecated=0 and horiz_crs_auth_name='EPSG'"
    ).fetchall()
    shift_index = {}
    shifts = []
    table = {}
    for code, kind in sorted(rows, key=lambda r: int(r[0])):
        crs = create(ctx, f'EPSG:{code}'.encode())
        if not crs:
            continue
        name = s(get_name(crs))
        if kind == 'G3':
            # PROJ picks different transformations to and from WGS 84 for some 3D geographic CRSs (e.g. ONGD14:
            # EPSG 7443 one way, 7442 the other), so no single answer is PROJ's; a grid needs a 2D CRS anyway
            table[str(code)] = [name, None, f'{name} is a 3D geographic CRS (with ellipsoidal heights); assign the grid its 2D geographic CRS instead (gdal_edit -a_srs)']
            destroy(crs)
            continue
        definition = crs_definition(crs)
        if not definition or '+proj=' not in definition:
            table[str(code)] = [name, None, f'{name}: PROJ gives no PROJ.4 definition for it']
            destroy(crs)
            continue
        unit = unit_problem(definition)
        if unit:
            table[str(code)] = [name, None, f'{name} uses {unit}, which Loftline does not read']
            destroy(crs)
            continue
        result = classify(crs, name, definition)
        destroy(crs)
        if 'refuse' in result:
            table[str(code)] = [name, None, result['refuse']]
            continue
        idx = []
        for shift, bbox, op_name, accuracy in result['shifts']:
            key = json.dumps([shift, bbox, op_name, accuracy])
            if key not in shift_index:
                shift_index[key] = len(shifts)
                box = bbox or [-180, -90, 180, 90]
                term = shift if isinstance(shift, str) else '+towgs84=' + ','.join(num(x) for x in shift)
                shifts.append([term, *box[:4], op_name, accuracy, *box[4:]])
            idx.append(shift_index[key])
        table[str(code)] = [name, definition, idx]
    for code, horiz in compounds:
        if str(horiz) in table:
            compound = create(ctx, f'EPSG:{code}'.encode())
            table[str(code)] = [s(get_name(compound)), f'={horiz}']
            destroy(compound)
    # vertical CRSs: their unit of measure (EPSG UoM code) for GeoTIFF files that name only the vertical CRS
    vertical = dict(db.execute(
        "select v.code, a.uom_code from vertical_crs v join axis a on a.coordinate_system_auth_name = v.coordinate_system_auth_name "
        "and a.coordinate_system_code = v.coordinate_system_code where v.auth_name='EPSG' and v.deprecated=0"
    ).fetchall())
    # prime meridians (GeogPrimeMeridianGeoKey): longitude from Greenwich in degrees
    pm = {}
    for code, lon, uom in db.execute("select code, longitude, uom_code from prime_meridian where auth_name='EPSG' and deprecated=0"):
        factor = {'9102': 1, '9105': 0.9, '9110': None, '9122': 1, '9101': 57.29577951308232}.get(str(uom))
        if factor is None:  # sexagesimal DDD.MMSSsss
            sign = -1 if lon < 0 else 1
            v = abs(lon)
            d = int(v)
            mm = int(round((v - d) * 100, 8))
            ss = ((v - d) * 100 - mm) * 100
            pm[str(code)] = round(sign * (d + mm / 60 + ss / 3600), 10)
        else:
            pm[str(code)] = round(lon * factor, 10)
    out = {
        'source': 'PROJ 9.1.1 database (Debian proj-bin/proj-data), via libproj; generated by python3 scripts/gen-epsg-table.py',
        'format': 'crs[code] = [name, proj4 without datum shift, [shift indices in PROJ order]] | [name, null, refusal] | [name, "=horizontal code"]; shifts[i] = [+towgs84 or +nadgrids=NTv2 file, west, south, east, north, transformation name, accuracy in metres (-1 unknown), 1 when offshore]; vertical[code] = EPSG unit of measure; primeMeridians[code] = degrees east of Greenwich',
        'shifts': shifts,
        'crs': table,
        'primeMeridians': pm,
        'vertical': {str(k): int(v) for k, v in sorted(vertical.items(), key=lambda kv: int(kv[0]))},
    }
    json.dump(out, sys.stdout, separators=(',', ':'), ensure_ascii=False)


if __name__ == '__main__':
    main()
