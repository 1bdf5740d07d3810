"""Second reader of the workbooks the project writes: opens each .xlsx given on the command line
with openpyxl (Debian python3-openpyxl, independent of exceljs) and prints one JSON document:

  {file: {"sheets": [{"name", "values": rows of cached values, "types": rows of openpyxl data
   types ("n" number, "s" text, "b" boolean, "f" formula, "e" error), "formats": rows of number
   formats, "formulas": [[cell, text]], "charts": number of charts, "freeze": "A3" or null}]}
   or {"error": "..."} when openpyxl refuses the file}

Used by test/second-readers.test.ts; never by the product.
"""
import json
import math
import sys

import openpyxl


def plain(v):
    if v is None or isinstance(v, (bool, int, str)):
        return v
    if isinstance(v, float):
        return v if math.isfinite(v) else repr(v)
    return str(v)


def read(path):
    try:
        with_formulas = openpyxl.load_workbook(path)
        cached = openpyxl.load_workbook(path, data_only=True)
    except Exception as e:  # the file is refused: report why
        return {"error": f"{type(e).__name__}: {e}"}
    sheets = []
    for ws in with_formulas.worksheets:
        wc = cached[ws.title]
        values, types, formats, formulas = [], [], [], []
        for row, row_cached in zip(ws.iter_rows(), wc.iter_rows()):
            values.append([plain(c.value) for c in row_cached])
            types.append([c.data_type for c in row])
            formats.append([c.number_format for c in row])
            for c in row:
                if c.data_type == "f":
                    text = c.value if isinstance(c.value, str) else getattr(c.value, "text", str(c.value))
                    formulas.append([c.coordinate, text])
        sheets.append({
            "name": ws.title,
            "values": values,
            "types": types,
            "formats": formats,
            "formulas": formulas,
            "charts": len(getattr(ws, "_charts", [])),
            "freeze": ws.freeze_panes,
        })
    return {"sheets": sheets}


if __name__ == "__main__":
    json.dump({p: read(p) for p in sys.argv[1:]}, sys.stdout, ensure_ascii=False)
