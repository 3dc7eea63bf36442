package store_test

import (
	"context"
	"errors"
	"fmt"
	"strings"
	"time"

	"fieldfit/ui/store"
)

func ExampleNewMemory() {
	ctx := context.Background()
	s := store.NewMemory()
	defer s.Close()

	when := time.Date(2030, 5, 2, 8, 15, 0, 0, time.UTC)
	_ = s.Put(ctx, store.Record{ID: "p2", Name: "Upper terrace slug tests", Rev: 1, Changed: when, Data: []byte(`{}`)})
	_ = s.Put(ctx, store.Record{ID: "p1", Name: "lower terrace pumping test", Rev: 3, Changed: when, Data: []byte(`{}`)})

	list, _ := s.List(ctx)
	for _, r := range list {
		fmt.Println(r.ID, r.Name, r.Rev)
	}
	_, err := s.Get(ctx, "p9")
	fmt.Println(errors.Is(err, store.ErrNotFound), err)
	// Output:
	// p1 lower terrace pumping test 3
	// p2 Upper terrace slug tests 1
	// true store: get "p9": no such project in the store
}

func ExampleSchema_Migrate() {
	// A later release that wants trimmed names adds one step from 1 to 2.
	next := store.Schema{Version: 2, Migrations: []store.Migration{{
		From: 1,
		Note: "trim names",
		Apply: func(r store.Record) (store.Record, error) {
			r.Name = strings.TrimSpace(r.Name)
			return r, nil
		},
	}}}
	out, err := next.Migrate(1, []store.Record{{ID: "a", Name: "  Well 4  "}})
	fmt.Printf("%q %v\n", out[0].Name, err)
	// Output: "Well 4" <nil>
}
