# Two commands do all set-up on a fresh machine: `make demo` and `make test`.
PYTHON ?= python3
VENV := .venv
PY := $(VENV)/bin/python
STAMP := $(VENV)/.installed

.PHONY: demo test lint nbval benchmark mutation clean venv

venv: $(STAMP)

$(STAMP): pyproject.toml
	$(PYTHON) -m venv $(VENV)
	$(PY) -m pip install --quiet --upgrade pip
	$(PY) -m pip install --quiet -e ".[notebook,dev]"
	$(PY) -m ipykernel install --sys-prefix --name calcpad --display-name "calcpad (venv)" > /dev/null
	touch $(STAMP)

demo: $(STAMP)
	$(PY) -m calcpad.cli run examples/harbor_ridge_condenser_stand.toml --out build/demo; \
	  rc=$$?; if [ $$rc -gt 1 ]; then exit $$rc; fi; \
	  rec=$$($(PY) -c 'from calcpad.runner.recordfile import find_record; print(find_record("build/demo").resolve())'); \
	  echo "submittal: $$(dirname $$rec)/submittal.pdf (when Chromium is installed) and submittal.html; record: $$rec"

test: $(STAMP)
	$(VENV)/bin/ruff check calcpad tests benchmarks tools
	$(VENV)/bin/pytest -q tests
	$(VENV)/bin/pytest -q --nbval notebooks/ --nbval-current-env --nbval-sanitize-with notebooks/nbval-sanitize.cfg -p no:randomly

lint: $(STAMP)
	$(VENV)/bin/ruff check calcpad tests benchmarks tools

# Plants each bug of tests/mutation/mutants.toml in a temporary copy and runs its tests (slow; not part of test/CI).
mutation: $(STAMP)
	$(PY) tests/mutation/run_mutants.py

benchmark: $(STAMP)
	$(PY) benchmarks/bench_core.py
	$(PY) benchmarks/bench_runner.py
	$(PY) benchmarks/bench_memory.py

clean:
	rm -rf $(VENV) build
