"""Parses every SVG given on the command line with xml.etree (Python's standard library) and
checks that each is an <svg> document with drawing content and text. Exit 1 on any failure."""
import sys
import xml.etree.ElementTree as ET

failed = 0
for path in sys.argv[1:]:
    try:
        root = ET.parse(path).getroot()
    except ET.ParseError as e:
        print(f"{path}: does not parse: {e}")
        failed += 1
        continue
    tag = root.tag.split('}')[-1]
    texts = [e for e in root.iter() if e.tag.split('}')[-1] == "text"]
    shapes = [e for e in root.iter() if e.tag.split('}')[-1] in ("path", "rect", "polyline", "line", "ellipse", "circle")]
    if tag != "svg" or not texts or not shapes:
        print(f"{path}: root {tag}, {len(texts)} text, {len(shapes)} shapes")
        failed += 1
print(f"{len(sys.argv) - 1} SVG files, {failed} failed")
sys.exit(1 if failed else 0)
