"""One marked section of bench/RESULTS.md, rewritten in place by scripts/benchmark.sh.

A section lies between "<!-- NAME: begin -->" and "<!-- NAME: end -->"; the rest of the file (the
generated table above and the hand-written analysis) is kept. A file without the section gets it
appended.
"""
import os


def write_section(out, name, block):
    """Replace (or append) section `name` of file `out` with the lines `block` (markers added here)."""
    b, e = "<!-- %s: begin -->" % name, "<!-- %s: end -->" % name
    lines = "\n".join([b] + block + [e])
    text = open(out).read() if os.path.exists(out) else "# rimline scale benchmark\n"
    if b in text and e in text:
        text = text[:text.index(b)] + lines + text[text.index(e) + len(e):]
    else:
        text = text.rstrip("\n") + "\n\n" + lines + "\n"
    open(out, "w").write(text)
    print("wrote the %s section of %s" % (name, out))
