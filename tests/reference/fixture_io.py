"""Shared by the reference scripts: print the fixture as JSON, and with --write keep it beside the scripts."""
import json
import os
import sys


def emit(filename, data):
    text = json.dumps(data, indent=1)
    if '--write' in sys.argv:
        with open(os.path.join(os.path.dirname(os.path.abspath(__file__)), filename), 'w') as f:
            f.write(text + '\n')
    print(text)


def provenance(source, generator):
    """What heads a fixture: its outside source, the script that computed it, and the library versions it ran with."""
    import numpy
    import scipy
    return {"source": source, "generator": generator, "scipy": scipy.__version__, "numpy": numpy.__version__,
            "python": sys.version.split()[0]}
