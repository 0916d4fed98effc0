package study

import (
	"errors"

	"edgewise/solver/project"
)

// FromProject decodes the study a project keeps under its "study" key
// (nil, nil when it has none). Errors name the path from the project's
// top, such as study.vary[0].name.
func FromProject(p *project.Project) (*Study, error) {
	if p.Study == "" {
		return nil, nil
	}
	s, err := Decode([]byte(p.Study), p)
	if err != nil {
		var pe *project.Error
		if errors.As(err, &pe) {
			e := *pe
			e.Path = "study"
			if pe.Path != "" {
				e.Path += "." + pe.Path
				if pe.Path[0] == '[' {
					e.Path = "study" + pe.Path
				}
			}
			return nil, &e
		}
		return nil, err
	}
	return s, nil
}
