"""Parse CSV text with Python's csv module (RFC 4180 dialect 'excel'): the outside reference for
the CSV files fluxlane writes. stdin: {"text": str}; stdout: {"rows": [[str, ...], ...]}."""
import csv
import io
import json
import sys

doc = json.load(sys.stdin)
rows = list(csv.reader(io.StringIO(doc["text"], newline="")))
print(json.dumps({"rows": rows}))
