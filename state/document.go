package state

import (
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"io"

	"github.com/tabprep/tabprep"
)

// FormatName is the value of a document's "format" field.
const FormatName = "tabprep.state"

// FormatVersion is the newest document version this library reads and the
// version it writes. Every released version has a golden file in testdata
// that must always load.
const FormatVersion = 1

// DefaultMaxBytes is the size limit [Read] applies when none is given.
const DefaultMaxBytes = 64 << 20

// Sentinel errors of this package, for errors.Is.
var (
	ErrFormat      = errors.New("state: not a tabprep state document")
	ErrVersion     = errors.New("state: format version not supported")
	ErrChecksum    = errors.New("state: checksum mismatch")
	ErrTooLarge    = errors.New("state: document too large")
	ErrUnknownKind = errors.New("state: unknown step kind")
)

// Document is one saved fitted pipeline.
type Document struct {
	Format   string         `json:"format"`
	Version  int            `json:"version"`
	Library  string         `json:"library"`
	Input    tabprep.Schema `json:"input"`
	Steps    []Record       `json:"steps"`
	Output   tabprep.Schema `json:"output"`
	Training Fingerprint    `json:"training"`
	// Checksum is "sha256:" and the hex SHA-256 of the body: the compact
	// JSON encoding of the document with Checksum empty.
	Checksum string `json:"checksum"`
}

// Record is one step of a document.
type Record struct {
	Kind   string          `json:"kind"`
	Spec   json.RawMessage `json:"spec"`
	Params json.RawMessage `json:"params"`
}

// NewDocument returns a document of the given fitted steps, schemas and
// training fingerprint, with format, versions and checksum filled in.
func NewDocument(steps []Fitted, in, out tabprep.Schema, training Fingerprint) (*Document, error) {
	doc := &Document{
		Format: FormatName, Version: FormatVersion, Library: tabprep.Version,
		Input: in, Output: out, Training: training, Steps: make([]Record, len(steps)),
	}
	for i, s := range steps {
		spec, err := json.Marshal(s.Spec())
		if err != nil {
			return nil, fmt.Errorf("state: step %d (%s): spec: %w", i, s.Kind(), err)
		}
		params, err := json.Marshal(s.Params())
		if err != nil {
			return nil, fmt.Errorf("state: step %d (%s): params: %w", i, s.Kind(), err)
		}
		doc.Steps[i] = Record{Kind: s.Kind(), Spec: spec, Params: params}
	}
	sum, err := doc.sum()
	if err != nil {
		return nil, err
	}
	doc.Checksum = sum
	return doc, nil
}

// sum returns the checksum of the body of doc.
func (doc *Document) sum() (string, error) {
	body := *doc
	body.Checksum = ""
	b, err := json.Marshal(&body)
	if err != nil {
		return "", fmt.Errorf("state: encoding body: %w", err)
	}
	h := sha256.Sum256(b)
	return "sha256:" + hex.EncodeToString(h[:]), nil
}

// FittedSteps decodes the steps of doc through the registry.
func (doc *Document) FittedSteps() ([]Fitted, error) {
	out := make([]Fitted, len(doc.Steps))
	for i, r := range doc.Steps {
		f, err := Decode(r.Kind, r.Spec, r.Params)
		if err != nil {
			return nil, fmt.Errorf("state: step %d: %w", i, err)
		}
		out[i] = f
	}
	return out, nil
}

// Write writes doc as indented JSON.
func Write(w io.Writer, doc *Document) error {
	b, err := json.MarshalIndent(doc, "", "  ")
	if err != nil {
		return fmt.Errorf("state: encoding document: %w", err)
	}
	b = append(b, '\n')
	_, err = w.Write(b)
	return err
}

// ReadOptions adjusts [Read]. The zero value is the default.
type ReadOptions struct {
	// MaxBytes is the largest document accepted; 0 means DefaultMaxBytes.
	MaxBytes int64
}

// Read reads and checks one document: size, JSON syntax with no unknown
// fields, format name, version and checksum. It does not decode the steps;
// see [Document.FittedSteps].
func Read(r io.Reader, opts ReadOptions) (*Document, error) {
	limit := opts.MaxBytes
	if limit <= 0 {
		limit = DefaultMaxBytes
	}
	b, err := io.ReadAll(io.LimitReader(r, limit+1))
	if err != nil {
		return nil, fmt.Errorf("state: reading document: %w", err)
	}
	if int64(len(b)) > limit {
		return nil, fmt.Errorf("%w: more than %d bytes; raise ReadOptions.MaxBytes if the document is trusted", ErrTooLarge, limit)
	}
	// Look at the envelope first, so that a newer document gets a version
	// error rather than a complaint about fields this version does not know.
	var head struct {
		Format  string `json:"format"`
		Version int    `json:"version"`
	}
	if err := json.Unmarshal(b, &head); err != nil {
		return nil, fmt.Errorf("%w: %v", ErrFormat, err)
	}
	if head.Format != FormatName {
		return nil, fmt.Errorf("%w: format is %q, want %q", ErrFormat, head.Format, FormatName)
	}
	if head.Version > FormatVersion || head.Version < 1 {
		return nil, fmt.Errorf("%w: version %d; this library (tabprep %s) reads versions 1 to %d: upgrade tabprep to load it",
			ErrVersion, head.Version, tabprep.Version, FormatVersion)
	}
	doc := new(Document)
	if err := strictUnmarshal(b, doc); err != nil {
		return nil, fmt.Errorf("%w: %v", ErrFormat, err)
	}
	if err := doc.Input.Validate(); err != nil {
		return nil, fmt.Errorf("%w: input schema: %v", ErrFormat, err)
	}
	if err := doc.Output.Validate(); err != nil {
		return nil, fmt.Errorf("%w: output schema: %v", ErrFormat, err)
	}
	want, err := doc.sum()
	if err != nil {
		return nil, err
	}
	if doc.Checksum != want {
		return nil, fmt.Errorf("%w: document says %q, body hashes to %q; the file was edited or damaged, save it again from the fitted pipeline",
			ErrChecksum, doc.Checksum, want)
	}
	return doc, nil
}
