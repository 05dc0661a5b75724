# pliant_data.py: reads a Pliant dataset folder into a training loop.
#
# Shipped with Pliant (print it with `pliant loader`, write it with `pliant loader --out PATH`)
# and described in sim/dataset/LAYOUT.md, section "Loading a dataset in Python". One file, so it
# can be copied next to a training script. It needs only NumPy; h5py is imported only when an
# episode is read from a split HDF5 file, and the PyTorch class exists only when torch imports.
#
#   import pliant_data
#   ds = pliant_data.PliantDataset("datasets/tether")
#   stats = ds.statistics("train")              # from the manifest, else one streaming pass
#   for w in ds.windows("train", history=10, horizon=5, stride=5):
#       w["history_positions"]                  # (history, N, 3) m
#   batch = pliant_data.collate_windows([w1, w2, ...])   # padded to the largest N, with node_mask
#
# Simulated data does not replace hardware testing: bring controllers trained on it up on
# hardware with conservative limits and under your lab's own safety rules.

import json
import os

import numpy as np

__all__ = [
    "PliantDataset",
    "WindowSpec",
    "collate_windows",
    "normalise_window",
    "NORMALISED_ARRAYS",
    "NORMALISATION_KEY",
]

# The per-split statistics are read from manifest["normalisation"][split][array] =
# {"mean": [...], "std": [...]} (one value per coordinate or control channel) when a manifest
# carries them; otherwise they are computed from the split's episodes.
NORMALISATION_KEY = "normalisation"
# Arrays the windows are cut from and the statistics cover; the last axis is what a mean and a
# standard deviation are kept for (x, y, z, or one control channel each).
NORMALISED_ARRAYS = ("positions", "velocities", "controls")
# Arrays that describe the graph and stay the same in every window of an episode.
STATIC_ARRAYS = ("node_features",)


class PliantDataError(Exception):
    """A dataset folder that cannot be read as asked: the message names the file and the fix."""


class WindowSpec:
    """Fixed-length windows: `history` states in, `horizon` states to predict, every `stride` records.

    A window starting at record s holds states s .. s+history-1 (history_*), states
    s+history .. s+history+horizon-1 (future_*) and the controls rows s .. s+history+horizon-2:
    control row t is applied from state t to state t+1, so these are exactly the controls that
    lead from the first history state to the last future state.
    """

    def __init__(self, history, horizon, stride=1):
        for name, value, low in (("history", history, 1), ("horizon", horizon, 0), ("stride", stride, 1)):
            if int(value) != value or value < low:
                raise ValueError(f"{name}={value!r} must be a whole number of at least {low}")
        self.history, self.horizon, self.stride = int(history), int(horizon), int(stride)

    @property
    def states(self):
        return self.history + self.horizon

    def starts(self, state_count):
        """Start records of the windows that fit in an episode of `state_count` states (T+1)."""
        return range(0, max(0, state_count - self.states + 1), self.stride)


class PliantDataset:
    """One dataset folder: its manifest, its ok episodes per split, their arrays and statistics."""

    def __init__(self, folder, prefer="npz"):
        if prefer not in ("npz", "hdf5"):
            raise ValueError(f'prefer={prefer!r} must be "npz" or "hdf5"')
        self.folder = os.fspath(folder)
        self.prefer = prefer
        path = os.path.join(self.folder, "manifest.json")
        try:
            with open(path, "r", encoding="utf-8") as f:
                self.manifest = json.load(f)
        except FileNotFoundError:
            raise PliantDataError(f"{path} does not exist: give the folder `pliant generate --out` wrote") from None
        except json.JSONDecodeError as error:
            raise PliantDataError(f"{path}:{error.lineno}:{error.colno}: not valid JSON ({error.msg}); run `pliant verify {self.folder}`") from None
        self._episodes = {e["id"]: e for e in self.manifest.get("episodes", []) if e.get("status") == "ok"}
        # HDF5 array names are "<id>/<array>"; remember which split file holds each episode.
        self._hdf5_file = {}
        for record in self.manifest.get("files", []):
            if record.get("kind") == "split-hdf5":
                for episode_id in record.get("episodes", []):
                    self._hdf5_file[episode_id] = record["path"]
        self._computed_statistics = {}
        self._open_hdf5 = {}

    # --- episodes -------------------------------------------------------------------------

    def splits(self):
        """Split names with at least one ok episode, in manifest order."""
        seen = []
        for e in self._episodes.values():
            if e["split"] not in seen:
                seen.append(e["split"])
        return seen

    def episodes(self, split=None):
        """Manifest records of the ok episodes (of one split), in index order; rejected ones have no files."""
        chosen = [e for e in self._episodes.values() if split is None or e["split"] == split]
        if split is not None and not chosen:
            known = ", ".join(self.splits()) or "none"
            raise PliantDataError(f'{self.folder}/manifest.json has no ok episode in split "{split}"; splits with episodes: {known}')
        return chosen

    def record(self, episode_id):
        try:
            return self._episodes[episode_id]
        except KeyError:
            raise PliantDataError(f"{self.folder}/manifest.json lists no ok episode {episode_id!r}; see `pliant inspect {self.folder}`") from None

    def load_episode(self, episode_id, source=None):
        """Every array of one episode as a dict of NumPy arrays, from its NPZ or its split's HDF5 file.

        source: "npz", "hdf5" or None (the dataset's `prefer`, falling back to the file that exists).
        """
        record = self.record(episode_id)
        npz_path = os.path.join(self.folder, "episodes", f"{episode_id}.npz")
        has_npz = f"episodes/{episode_id}.npz" in record.get("files", [])
        has_hdf5 = episode_id in self._hdf5_file
        wanted = source or self.prefer
        if wanted not in ("npz", "hdf5"):
            raise ValueError(f'source={source!r} must be "npz", "hdf5" or None')
        if source is None:
            wanted = wanted if (has_npz if wanted == "npz" else has_hdf5) else ("hdf5" if has_hdf5 else "npz")
        if wanted == "npz":
            if not has_npz:
                raise PliantDataError(f"{episode_id} has no NPZ file (export format {self.manifest['export']['format']!r}); read it with source=\"hdf5\"")
            with np.load(npz_path) as archive:
                return {name: archive[name] for name in archive.files}
        if not has_hdf5:
            raise PliantDataError(f"{episode_id} is in no split HDF5 file (export format {self.manifest['export']['format']!r}); read it with source=\"npz\"")
        group = self._hdf5(self._hdf5_file[episode_id])[episode_id]
        return {name: group[name][...] for name in group.keys()}

    def iter_episodes(self, split, source=None):
        """(record, arrays) for each ok episode of a split, one episode in memory at a time."""
        for record in self.episodes(split):
            yield record, self.load_episode(record["id"], source)

    def _hdf5(self, relative):
        if relative not in self._open_hdf5:
            try:
                import h5py  # only here: NPZ-only readers need no h5py
            except ImportError:
                raise PliantDataError("reading the split HDF5 files needs h5py (Debian: apt-get install python3-h5py); or read the NPZ files") from None
            self._open_hdf5[relative] = h5py.File(os.path.join(self.folder, relative), "r")
        return self._open_hdf5[relative]

    def close(self):
        for handle in self._open_hdf5.values():
            handle.close()
        self._open_hdf5.clear()

    def __enter__(self):
        return self

    def __exit__(self, *exc):
        self.close()

    # --- statistics -----------------------------------------------------------------------

    def statistics(self, split, source=None):
        """{array: {"mean": float64 (D,), "std": float64 (D,), "count": n or None}} over one split.

        Read from the manifest's "normalisation" member when it has this split, else computed
        once from the split's ok episodes (and kept). std is the population standard deviation
        (NumPy's default ddof=0); a zero std (a coordinate that never moves) is reported as is.
        """
        stored = self.manifest.get(NORMALISATION_KEY)
        if isinstance(stored, dict) and isinstance(stored.get(split), dict):
            out = {}
            for name in NORMALISED_ARRAYS:
                entry = stored[split].get(name)
                if entry is None:
                    continue
                out[name] = {"mean": np.asarray(entry["mean"], dtype=np.float64),
                             "std": np.asarray(entry["std"], dtype=np.float64),
                             "count": entry.get("count")}
                # Pliant's manifests also carry the range of each column.
                for bound in ("min", "max"):
                    if bound in entry:
                        out[name][bound] = np.asarray(entry[bound], dtype=np.float64)
            if out:
                return out
        if split not in self._computed_statistics:
            self._computed_statistics[split] = self._stream_statistics(split, source)
        return self._computed_statistics[split]

    def _stream_statistics(self, split, source):
        # One pass over the split with Welford's algorithm (Welford 1962, Technometrics 4:419),
        # each episode's block merged into the running mean and sum of squared deviations by the
        # pairwise update of Chan, Golub & LeVeque (1979): no second pass and no cancellation of
        # a large mean against a small spread, in float64 whatever the files' dtype.
        running = {name: None for name in NORMALISED_ARRAYS}
        for _, arrays in self.iter_episodes(split, source):
            for name in NORMALISED_ARRAYS:
                values = arrays[name]
                block = values.reshape(-1, values.shape[-1]).astype(np.float64)
                if block.shape[0] == 0:
                    continue
                n_b = block.shape[0]
                mean_b = block.mean(axis=0)
                m2_b = ((block - mean_b) ** 2).sum(axis=0)
                if running[name] is None:
                    running[name] = [n_b, mean_b, m2_b]
                    continue
                n_a, mean_a, m2_a = running[name]
                if mean_a.shape != mean_b.shape:
                    raise PliantDataError(f'{name} has {mean_a.shape[0]} columns in one episode of split "{split}" and {mean_b.shape[0]} in another; statistics need the same columns')
                n = n_a + n_b
                delta = mean_b - mean_a
                running[name] = [n, mean_a + delta * (n_b / n), m2_a + m2_b + delta * delta * (n_a * n_b / n)]
        out = {}
        for name, state in running.items():
            if state is not None:
                n, mean, m2 = state
                out[name] = {"mean": mean, "std": np.sqrt(m2 / n), "count": int(n)}
        return out

    # --- windows --------------------------------------------------------------------------

    def window_index(self, split, spec):
        """(episode id, start record) of every window of a split, from the manifest alone."""
        index = []
        for record in self.episodes(split):
            state_count = record["simulation"]["recordedSteps"] + 1
            index.extend((record["id"], s) for s in spec.starts(state_count))
        return index

    def windows(self, split, history, horizon, stride=1, normalise=False, source=None):
        """Every window of a split as a dict of arrays, one episode loaded at a time."""
        spec = WindowSpec(history, horizon, stride)
        stats = self.statistics(split, source) if normalise else None
        for record, arrays in self.iter_episodes(split, source):
            for start in spec.starts(arrays["positions"].shape[0]):
                window = cut_window(arrays, record["id"], start, spec)
                yield normalise_window(window, stats) if stats is not None else window


def cut_window(arrays, episode_id, start, spec):
    """The window of `spec` starting at record `start` of one episode's arrays (views, not copies)."""
    s, h, f = start, spec.history, spec.horizon
    if s < 0 or s + h + f > arrays["positions"].shape[0]:
        raise PliantDataError(f"{episode_id}: a window of {h}+{f} states from record {s} does not fit in {arrays['positions'].shape[0]} states")
    window = {"episode_id": episode_id, "start": s}
    for name in ("positions", "velocities"):
        window[f"history_{name}"] = arrays[name][s:s + h]
        window[f"future_{name}"] = arrays[name][s + h:s + h + f]
    window["controls"] = arrays["controls"][s:s + h + f - 1]
    for name in STATIC_ARRAYS:
        if name in arrays:
            window[name] = arrays[name]
    return window


def normalise_window(window, stats):
    """(x − mean) / std per coordinate or channel, in the window's dtype; a zero std divides by 1."""
    out = dict(window)
    for key, value in window.items():
        name = key.split("_", 1)[1] if key.startswith(("history_", "future_")) else key
        if name in stats and isinstance(value, np.ndarray):
            std = np.where(stats[name]["std"] > 0, stats[name]["std"], 1.0)
            out[key] = ((value - stats[name]["mean"]) / std).astype(value.dtype)
    return out


def collate_windows(windows):
    """Stacks windows into one batch, padding the node axis to the largest node count.

    Padded nodes hold zeros; node_mask (B, N_max) is True for real nodes and False for padding,
    so a loss can ignore them. Control columns must agree within a batch (one scenario).
    """
    if not windows:
        raise ValueError("collate_windows needs at least one window")
    node_max = max(w["history_positions"].shape[1] for w in windows)
    batch = {"episode_id": [w["episode_id"] for w in windows],
             "start": np.array([w["start"] for w in windows], dtype=np.int64)}
    mask = np.zeros((len(windows), node_max), dtype=bool)
    for i, w in enumerate(windows):
        mask[i, :w["history_positions"].shape[1]] = True
    batch["node_mask"] = mask
    for key in ("history_positions", "history_velocities", "future_positions", "future_velocities"):
        first = windows[0][key]
        out = np.zeros((len(windows), first.shape[0], node_max) + first.shape[2:], dtype=first.dtype)
        for i, w in enumerate(windows):
            out[i, :, :w[key].shape[1]] = w[key]
        batch[key] = out
    columns = {w["controls"].shape[1] for w in windows}
    if len(columns) != 1:
        raise PliantDataError(f"windows in one batch have different control channel counts {sorted(columns)}; batch episodes of one scenario")
    batch["controls"] = np.stack([w["controls"] for w in windows])
    for name in STATIC_ARRAYS:
        if all(name in w for w in windows):
            first = windows[0][name]
            out = np.zeros((len(windows), node_max) + first.shape[1:], dtype=first.dtype)
            for i, w in enumerate(windows):
                out[i, :w[name].shape[0]] = w[name]
            batch[name] = out
    return batch


try:
    import torch as _torch
except ImportError:  # NumPy alone is enough for everything above
    _torch = None

if _torch is not None:
    __all__ += ["PliantWindowDataset", "torch_collate"]

    class PliantWindowDataset(_torch.utils.data.Dataset):
        """A map-style PyTorch Dataset over the windows of one split; use with collate_fn=torch_collate.

        The window list comes from the manifest alone; episodes are read on demand, the last
        `cache_episodes` kept, so a DataLoader without shuffling reads each file once.
        """

        def __init__(self, folder, split, history, horizon, stride=1, normalise=False, source=None, cache_episodes=4):
            self.dataset = folder if isinstance(folder, PliantDataset) else PliantDataset(folder)
            self.split, self.source = split, source
            self.spec = WindowSpec(history, horizon, stride)
            self.index = self.dataset.window_index(split, self.spec)
            self.stats = self.dataset.statistics(split, source) if normalise else None
            self.cache_episodes = max(1, int(cache_episodes))
            self._cache = {}

        def __len__(self):
            return len(self.index)

        def __getitem__(self, i):
            episode_id, start = self.index[i]
            arrays = self._cache.pop(episode_id, None)
            if arrays is None:
                arrays = self.dataset.load_episode(episode_id, self.source)
            self._cache[episode_id] = arrays  # most recent last
            while len(self._cache) > self.cache_episodes:
                self._cache.pop(next(iter(self._cache)))
            window = cut_window(arrays, episode_id, start, self.spec)
            return normalise_window(window, self.stats) if self.stats is not None else window

    def torch_collate(windows):
        """collate_windows, with every array as a torch tensor (episode ids stay a list)."""
        batch = collate_windows(windows)
        return {k: (v if k == "episode_id" else _torch.from_numpy(np.ascontiguousarray(v))) for k, v in batch.items()}
