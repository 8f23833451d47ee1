package demo

import "finmarch/airflow/transient"

// Ride is a built-in ride profile: an invented scenario, named for what it
// tests.
type Ride struct {
	Name, What string
	Segments   []transient.Segment
}

const kmh = 1 / 3.6

// Rides are the built-in profiles for 'finmarch ride --profile'. Speeds,
// grades and durations are invented, chosen to show the cases that
// overheat an air-cooled engine: a hard run that ends standing in traffic,
// a long climb that ends at a stop, and slow town traffic.
var Rides = []Ride{
	{"run-then-jam", "20 min at 90 km/h on the level, then 15 min standing at idle in a jam",
		[]transient.Segment{{Duration: 1200, Speed: 90 * kmh}, {Duration: 900}}},
	{"mountain-pass", "5 min at 80 km/h on the level, 20 min at 60 km/h up a 7 % grade, then 10 min standing at the top",
		[]transient.Segment{{Duration: 300, Speed: 80 * kmh}, {Duration: 1200, Speed: 60 * kmh, Grade: 7}, {Duration: 600}}},
	{"city-crawl", "30 min of town traffic: every 2 min, 40 s standing, 50 s at 30 km/h, 30 s at 50 km/h",
		crawl()},
}

func crawl() []transient.Segment {
	var s []transient.Segment
	for i := 0; i < 15; i++ {
		s = append(s, transient.Segment{Duration: 40}, transient.Segment{Duration: 50, Speed: 30 * kmh}, transient.Segment{Duration: 30, Speed: 50 * kmh})
	}
	return s
}

// RideNames lists the built-in profiles' names.
func RideNames() []string {
	var out []string
	for _, r := range Rides {
		out = append(out, r.Name)
	}
	return out
}
