# `make demo` converts the shipped corpus; `make test` runs the whole test suite.
# Both build a local virtual environment from pyproject.toml first.
PYTHON ?= python3
VENV := .venv
BIN := $(VENV)/bin

$(BIN)/porter: pyproject.toml
	$(PYTHON) -m venv $(VENV)
	$(BIN)/python -m pip install --quiet --upgrade pip
	$(BIN)/python -m pip install --quiet -e ".[test,dask]"
	touch $(BIN)/porter

.PHONY: demo test
demo: $(BIN)/porter
	$(BIN)/python -m porter.demo

test: $(BIN)/porter
	$(BIN)/python -m pytest -q
