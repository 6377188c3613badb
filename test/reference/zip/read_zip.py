"""Read a ZIP archive with Python's own zipfile module (an independent reader) and report what it
holds: {"bad": name of the first entry whose CRC fails or null, "entries": [{"name", "size", "crc",
"method", "date", "data_b64"}]}. The archive's path is the first argument."""
import base64
import json
import sys
import zipfile

with zipfile.ZipFile(sys.argv[1]) as z:
    out = {"bad": z.testzip(), "entries": []}
    for info in z.infolist():
        out["entries"].append({
            "name": info.filename,
            "size": info.file_size,
            "crc": info.CRC,
            "method": info.compress_type,
            "date": list(info.date_time),
            "data_b64": base64.b64encode(z.read(info)).decode("ascii"),
        })
print(json.dumps(out))
