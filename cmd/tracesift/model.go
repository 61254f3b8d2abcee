package main

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"fmt"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/models"
)

// currentSchema is the identity of the running feature catalogue, stored in
// every model trained here and checked on every model loaded.
func currentSchema() classifier.Schema {
	return classifier.Schema{Version: features.SchemaVersion, Hash: features.SchemaHash()}
}

// loadModel returns the model at path, or the embedded default when path is
// empty, refusing one trained on another feature schema.
func loadModel(path string) (*classifier.Model, error) {
	var (
		m   *classifier.Model
		err error
	)
	if path == "" {
		m, err = classifier.Read(bytes.NewReader(models.Default()))
		if err != nil {
			return nil, fmt.Errorf("%s: %w", models.DefaultName, err)
		}
		m.Source = models.DefaultName
	} else if m, err = classifier.Load(path); err != nil {
		return nil, err
	}
	if err := m.CheckSchema(currentSchema()); err != nil {
		if path == "" {
			return nil, fmt.Errorf("%w (rebuild it with: %s)", err, models.DefaultCommand)
		}
		return nil, fmt.Errorf("%w (retrain it with this version of tracesift)", err)
	}
	return m, nil
}

// loadModelSum is loadModel that also returns the SHA-256 of the model's
// bytes, which journal records are keyed by.
func loadModelSum(path string) (*classifier.Model, string, error) {
	m, err := loadModel(path)
	if err != nil {
		return nil, "", err
	}
	if path == "" {
		s := sha256.Sum256(models.Default())
		return m, hex.EncodeToString(s[:]), nil
	}
	sum := fileSum(path)
	if sum == "" {
		return nil, "", fmt.Errorf("%s: cannot be read again", path)
	}
	return m, sum, nil
}
